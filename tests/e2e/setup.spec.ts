// Figures here are invented fixture values; each check compares the screen with what the API stored
// (common practice, no source).
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

// Compiling the set-up page with Leaflet on first request can take a while on a busy machine.
test.setTimeout(600_000);

async function openSetup(page: Page, farmId: string): Promise<void> {
  await page.goto(`/farms/${farmId}/setup`);
  await expect(page.getByRole("heading", { name: "Farm set-up" })).toBeVisible({ timeout: 120_000 });
  await expect(page.locator(".leaflet-container")).toBeVisible({ timeout: 60_000 });
}

const hectares = async (page: Page, text: RegExp): Promise<number> => {
  const content = (await page.getByText(text).first().textContent()) ?? "";
  return Number(/([\d.]+) ha/.exec(content)?.[1]);
};

test("a manager draws a new field on the map, then moves a corner, and the area follows", async ({ page }, info) => {
  const farmId = await openKestrelBend(page, DEMO.manager);
  await openSetup(page, farmId);
  const name = `Drawn ${info.project.name} ${Date.now()}`;

  await page.getByRole("button", { name: "Draw a new field" }).click();
  const map = page.locator(".leaflet-container");
  await map.scrollIntoViewIfNeeded();
  const box = (await map.boundingBox())!;
  // A square in the map's middle, clear of the zoom buttons; the last click closes the outline on its first corner.
  const x0 = box.x + box.width * 0.35;
  const y0 = box.y + box.height * 0.35;
  const side = Math.min(box.width, box.height) * 0.3;
  const corners: [number, number][] = [
    [x0, y0],
    [x0 + side, y0],
    [x0 + side, y0 + side],
    [x0, y0 + side],
    [x0, y0],
  ];
  for (const [x, y] of corners) {
    await page.mouse.click(x, y);
    await page.waitForTimeout(150);
  }
  await expect(page.getByTestId("pending-area")).toContainText("ha");
  await page.getByRole("button", { name: "Next: name the field" }).click();
  await page.getByLabel("Field name").fill(name);
  await page.getByRole("button", { name: "Add field" }).click();
  await expect(page.getByText(`${name} saved:`)).toBeVisible({ timeout: 30_000 });
  const firstHa = await hectares(page, new RegExp(`${name} saved:`));
  expect(firstHa).toBeGreaterThan(0);
  await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-setup-drawn.png`, fullPage: true });

  // Pull the far corner outwards: the square grows, and so must its area.
  await page.getByRole("button", { name: "Edit corners" }).click();
  // Saving moved the page; find the far corner's handle where it is now (Geoman's vertex markers).
  await map.scrollIntoViewIfNeeded();
  const handles = map.locator(".marker-icon:not(.marker-icon-middle)");
  await expect(handles.first()).toBeVisible();
  const boxes = (await handles.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect))).filter((b) => b.width > 0);
  const far = boxes.reduce((a, b) => (b.x + b.y > a.x + a.y ? b : a));
  const [fx, fy] = [far.x + far.width / 2, far.y + far.height / 2];
  await page.mouse.move(fx, fy);
  await page.mouse.down();
  await page.mouse.move(fx + side * 0.4, fy + side * 0.4, { steps: 8 });
  await page.mouse.up();
  await expect(page.getByTestId("pending-area")).toBeVisible();
  await page.getByRole("button", { name: "Save outline" }).click();
  await expect(page.getByText(`Outline of ${name} saved:`)).toBeVisible({ timeout: 30_000 });
  const secondHa = await hectares(page, new RegExp(`Outline of ${name} saved:`));
  expect(secondHa).toBeGreaterThan(firstHa);
  await expect(page.getByTestId("field-area")).toContainText(`${secondHa.toFixed(2)} ha`);
  await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-setup-edited.png`, fullPage: true });

  // The API agrees, and the test field is archived so the demo farm stays as it was.
  const fields = (await (await page.request.get(`/api/v1/farms/${farmId}/fields`)).json()) as { data: { id: string; name: string; areaHa: number }[] };
  const stored = fields.data.find((f) => f.name === name)!;
  expect(stored.areaHa).toBeCloseTo(secondHa, 2);
  expect((await page.request.delete(`/api/v1/farms/${farmId}/fields/${stored.id}`)).status()).toBe(204);
});

test("a manager changes an irrigation system's flow rate; a refused value names the input", async ({ page }, info) => {
  const farmId = await openKestrelBend(page, DEMO.manager);
  await openSetup(page, farmId);
  const axe = await new AxeBuilder({ page }).exclude(".leaflet-container").analyze();
  expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical")).toEqual([]);

  const systems = page.getByRole("region", { name: "Irrigation systems" });
  await systems.getByRole("button", { name: /^Edit / }).first().click();
  const form = systems.getByRole("form");
  const efficiency = form.getByLabel("Application efficiency (0-1)");
  const before = await efficiency.inputValue();
  // Efficiency is a share of 1 (lib/validation/irrigation-system.ts): 85 is a percent typed by mistake.
  await efficiency.fill("85");
  await form.getByRole("button", { name: "Save system" }).click();
  await expect(form.getByText(/Application efficiency must be at most 1/).first()).toBeVisible();
  await efficiency.fill(before);
  await form.getByLabel("Flow rate (m³/h)").fill("321");
  await form.getByRole("button", { name: "Save system" }).click();
  await expect(systems.getByText("321 m³/h")).toBeVisible();
  await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-setup-systems.png`, fullPage: true });
});

test("an agronomist cannot open set-up", async ({ page }) => {
  const farmId = await openKestrelBend(page, DEMO.agronomist);
  expect((await page.goto(`/farms/${farmId}/setup`))?.status()).toBe(403);
});
