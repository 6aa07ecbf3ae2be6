import { expect, test } from "@playwright/test";
import { DEMO, openKestrelBend, signIn } from "./helpers";

const ROLE_LABEL = { owner: "Owner", manager: "Farm manager", agronomist: "Agronomist", worker: "Field worker", viewer: "Viewer" };

for (const [role, email] of Object.entries(DEMO) as [keyof typeof DEMO, string][]) {
  test(`${role} signs in and sees the farm with their role`, async ({ page }, info) => {
    await openKestrelBend(page, email);
    await expect(page.getByText(ROLE_LABEL[role]).first()).toBeVisible();
    await expect(page.getByRole("heading", { name: "Farm map" })).toBeVisible();
    await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-farm-${role}.png`, fullPage: true });
  });
}

test("a wrong password gets a plain message and no session", async ({ page }) => {
  await signIn(page, DEMO.worker, "not-the-password");
  await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
  const res = await page.request.get("/api/v1/me");
  expect(res.status()).toBe(401);
});

test("a worker opening member administration gets 403, on the page and from the API", async ({ page }) => {
  const farmId = await openKestrelBend(page, DEMO.worker);
  await expect(page.getByRole("link", { name: "People" })).toHaveCount(0);
  const response = await page.goto(`/farms/${farmId}/members`);
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
  const api = await page.request.get(`/api/v1/farms/${farmId}/members`);
  expect(api.status()).toBe(403);
  expect((await api.json()).error.code).toBe("forbidden");
});

test("an owner sees the farm's people and can sign out", async ({ page }, info) => {
  const farmId = await openKestrelBend(page, DEMO.owner);
  await page.getByRole("link", { name: "People" }).click();
  await page.waitForURL(`**/farms/${farmId}/members`);
  await expect(page.getByText(DEMO.worker)).toBeVisible();
  await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-people-owner.png`, fullPage: true });
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.waitForURL("**/sign-in");
  expect((await page.request.get("/api/v1/me")).status()).toBe(401);
});

test("unknown API paths answer JSON 404", async ({ request }) => {
  const res = await request.get("/api/v1/no-such-thing");
  expect(res.status()).toBe(404);
  expect(await res.json()).toEqual({ error: { code: "not_found", message: "No API at /api/v1/no-such-thing." } });
});

test("pages carry a content security policy limited to this origin", async ({ request }) => {
  const res = await request.get("/sign-in");
  const csp = res.headers()["content-security-policy"] ?? "";
  expect(csp).toContain("default-src 'self'");
  expect(csp).toContain("frame-ancestors 'none'");
  expect(res.headers()["x-content-type-options"]).toBe("nosniff");
});
