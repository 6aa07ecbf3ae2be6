import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "rootbank-demo";

export const DEMO = {
  owner: "owner@kestrelbend.example",
  manager: "manager@kestrelbend.example",
  agronomist: "agronomist@kestrelbend.example",
  worker: "worker@kestrelbend.example",
  viewer: "viewer@kestrelbend.example",
} as const;

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Signs in and opens Kestrel Bend, choosing it from the list when the person has several farms. */
export async function openKestrelBend(page: Page, email: string): Promise<string> {
  await signIn(page, email);
  // Either the app opens, or the sign-in page says why not: a refusal fails here with its message.
  const refusal = page.getByRole("main").getByRole("alert").first();
  const outcome = await Promise.race([
    page.waitForURL(/\/farms(\/|$)/, { timeout: 120_000 }).then(() => "in", () => "timeout"),
    refusal.waitFor({ state: "visible", timeout: 120_000 }).then(() => "refused", () => "timeout"),
  ]);
  if (outcome === "refused") throw new Error(`sign-in as ${email} refused: ${await refusal.innerText()}`);
  await page.waitForURL(/\/farms(\/|$)/);
  if (/\/farms$/.test(new URL(page.url()).pathname)) {
    await page.getByRole("link", { name: /Kestrel Bend/ }).click();
  }
  await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
  await expect(page.getByText("Kestrel Bend").first()).toBeVisible();
  return new URL(page.url()).pathname.split("/")[2]!;
}
