import { readFile } from "node:fs/promises";
import { expect, test } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

const shot = (project: string, name: string) => `tests/artifacts/screens/${project}-${name}.png`;

test("a farm manager goes from the map to a field's sheet and on to the plan, and downloads it", async ({ page }, info) => {
  test.setTimeout(180_000);
  const phone = info.project.name === "phone";
  const farmId = await openKestrelBend(page, DEMO.manager);

  await expect(page.getByRole("heading", { name: "Farm map" })).toBeVisible();
  // The map draws every field with a boundary as a polygon coloured by its band.
  await expect(page.locator("path.rb-field").first()).toBeVisible({ timeout: 60_000 });
  await expect(page.getByText("Status bands, wet to dry")).toBeVisible();
  await page.screenshot({ path: shot(info.project.name, "map-manager") });

  // Tapping a polygon opens that field's sheet.
  await page.locator("path.rb-field").first().click();
  await page.waitForURL(new RegExp(`/farms/${farmId}/fields/[0-9a-f-]{36}$`));
  await expect(page.getByRole("heading", { name: "Next action" })).toBeVisible();
  await page.goBack();
  await expect(page.getByRole("heading", { name: "Farm map" })).toBeVisible();

  // The list, most urgent first (behind a toggle on phones).
  if (phone) await page.getByRole("button", { name: "List" }).click();
  const list = page.getByRole("list", { name: "Fields by urgency" });
  await expect(list).toBeVisible();
  if (phone) await page.screenshot({ path: shot(info.project.name, "map-list-manager") });
  const first = list.getByRole("link").first();
  const fieldName = (await first.locator("span.text-lg").textContent())?.trim() ?? "";
  await first.click();
  await page.waitForURL(new RegExp(`/farms/${farmId}/fields/[0-9a-f-]{36}$`));
  await expect(page.getByRole("heading", { name: fieldName, level: 1 })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Root zone now" })).toBeVisible();
  await expect(page.getByText("An estimate, not an instruction.")).toBeVisible();
  await expect(page.getByRole("heading", { name: "Why these numbers" })).toBeVisible();
  await expect(page.getByRole("region", { name: /Water account table/ }).getByRole("row").nth(1)).toBeVisible();
  await expect(page.locator(".recharts-surface").first()).toBeVisible({ timeout: 30_000 });
  await page.screenshot({ path: shot(info.project.name, "field-sheet-manager"), fullPage: true });

  // Imperial units for this person, then back to metric.
  await page.getByRole("button", { name: "Imperial" }).click();
  await expect(page.getByText(/Depletion [\d.]+ in of TAW/).first()).toBeVisible();
  await expect.poll(async () => (await (await page.request.get("/api/v1/me")).json()).user.unitSystem).toBe("imperial");
  await page.getByRole("button", { name: "Metric" }).click();
  await expect(page.getByText(/Depletion \d+ mm of TAW/).first()).toBeVisible();

  // The farm plan for the week, as CSV.
  await page.getByRole("navigation", { name: "Farm" }).getByRole("link", { name: "Plan" }).click();
  await page.waitForURL(`**/farms/${farmId}/plan`);
  await expect(page.getByRole("heading", { name: "Farm plan" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Day by day" })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByRole("heading", { name: /^Water order/ })).toBeVisible();
  await page.screenshot({ path: shot(info.project.name, "plan-manager"), fullPage: true });
  const downloading = page.waitForEvent("download");
  await page.getByRole("button", { name: "Download CSV" }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toMatch(/^rootbank-plan-\d{4}-\d{2}-\d{2}\.csv$/);
  const csv = await readFile((await download.path())!, "utf8");
  expect(csv.split("\r\n")[0]).toBe("field,system,flow_m3_h,due_date,start_date,end_date,gross_depth_mm,volume_m3,duration_h,late_days,unplaced_m3");

  // The printed water order stands on its own.
  await page.emulateMedia({ media: "print" });
  await page.screenshot({ path: shot(info.project.name, "plan-print-manager"), fullPage: true });
  await page.emulateMedia({ media: "screen" });
});
