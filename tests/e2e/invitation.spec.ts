import { expect, test } from "@playwright/test";
import { DEMO, openKestrelBend, signIn } from "./helpers";

test("an owner invites a worker, who joins through the e-mailed link and signs in", async ({ page }, info) => {
  const email = `new-hand-${info.project.name}-${Date.now()}@kestrelbend.example`;
  const farmId = await openKestrelBend(page, DEMO.owner);
  await page.goto(`/farms/${farmId}/members`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("worker");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByText("Invitation sent")).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.waitForURL("**/sign-in");

  // The local inbox shows the mail; its link opens the invitation.
  await page.goto("/dev/inbox");
  const mail = page.locator("li", { hasText: email }).first();
  await expect(mail).toContainText("invited you to join Kestrel Bend");
  await mail.getByRole("link").first().click();
  await expect(page.getByRole("heading", { name: "Join Kestrel Bend" })).toBeVisible();
  await page.getByLabel("Your name").fill("Sam Newhand");
  await page.getByLabel("Choose a password").fill("a sensible long password");
  await page.getByRole("button", { name: "Join the farm" }).click();
  await page.waitForURL("**/sign-in**");

  await signIn(page, email, "a sensible long password");
  await page.waitForURL(/\/farms\/[0-9a-f-]{36}$/);
  await expect(page.getByText("Sam Newhand · Field worker")).toBeVisible();
});
