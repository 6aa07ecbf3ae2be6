import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

/** Serious and critical axe findings, summarised so a failure says what and where. */
async function seriousViolations(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(" | ")}`);
}

test("the sign-in page has no serious accessibility problems", async ({ page }) => {
  await page.goto("/sign-in");
  await expect(page.getByRole("button", { name: "Sign in" })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});

test("the map, a field sheet, the plan and the people page have no serious accessibility problems", async ({ page }) => {
  test.setTimeout(180_000);
  const farmId = await openKestrelBend(page, DEMO.manager);

  await expect(page.locator("path.rb-field").first()).toBeVisible({ timeout: 60_000 });
  expect(await seriousViolations(page), "farm map").toEqual([]);

  // On phones the list sits behind its toggle (hidden), so the link is found by its address.
  const fieldLink = page.locator(`a[href^="/farms/${farmId}/fields/"]`).first();
  await page.goto((await fieldLink.getAttribute("href"))!);
  await expect(page.getByRole("heading", { name: "Next action" })).toBeVisible();
  await expect(page.getByRole("region", { name: /Water account table/ })).toBeVisible();
  expect(await seriousViolations(page), "field sheet").toEqual([]);

  await page.goto(`/farms/${farmId}/plan`);
  await expect(page.getByRole("heading", { name: "Day by day" })).toBeVisible({ timeout: 30_000 });
  expect(await seriousViolations(page), "farm plan").toEqual([]);

  await page.goto(`/farms/${farmId}/members`);
  await expect(page.getByRole("heading", { name: "People on this farm" })).toBeVisible();
  expect(await seriousViolations(page), "people").toEqual([]);
});
