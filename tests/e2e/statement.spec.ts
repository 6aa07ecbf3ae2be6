// The owner's season statement on the demo farm. Figures are the demo's invented data; each check compares
// the screen and the downloads with what the API computed (common practice, no source).
import { readFile } from "node:fs/promises";
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

// The worker's first recompute of the demo farm can take a while on a busy machine.
test.setTimeout(300_000);

interface StatementBody {
  totals: { fieldDays: number; lines: { irrigationGross: { volumeM3: number } } };
  allocation: { label: string };
}

/** The same rounding the page uses: thousands separators, no decimals. */
const whole = (v: number) => v.toLocaleString("en", { maximumFractionDigits: 0 });

async function statementWithDays(page: Page, farmId: string): Promise<StatementBody> {
  let body: StatementBody | undefined;
  await expect
    .poll(
      async () => {
        const res = await page.request.get(`/api/v1/farms/${farmId}/statement`).catch(() => null);
        if (!res || res.status() !== 200) return 0;
        body = (await res.json()) as StatementBody;
        return body.totals.fieldDays;
      },
      { timeout: 240_000, intervals: [2_000, 5_000] },
    )
    .toBeGreaterThan(0);
  return body!;
}

test("the owner opens the season statement, reads the totals and downloads the PDF and CSV", async ({ page }, info) => {
  const farmId = await openKestrelBend(page, DEMO.owner);
  const api = await statementWithDays(page, farmId);

  await page.getByRole("navigation", { name: "Farm" }).getByRole("link", { name: "Statement" }).click();
  await page.waitForURL(`**/farms/${farmId}/statement`);
  await expect(page.getByRole("heading", { name: "Season water statement" })).toBeVisible();
  const gross = page.getByRole("row", { name: /Irrigation applied, gross/ });
  await expect(gross).toContainText(whole(api.totals.lines.irrigationGross.volumeM3));
  await expect(page.getByTestId("closure")).toContainText("The books close to");
  await expect(page.getByRole("heading", { name: `Allocation, water year ${api.allocation.label}` })).toBeVisible();
  await expect(page.getByText(/estimates/i).first()).toBeVisible();
  await page.screenshot({ path: `tests/artifacts/screens/${info.project.name}-statement.png`, fullPage: true });

  // Phone and desktop: the page itself never scrolls sideways (wide tables scroll inside their own box).
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
  const axe = await new AxeBuilder({ page }).analyze();
  expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => v.id)).toEqual([]);

  const [pdf] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download PDF" }).click()]);
  expect(pdf.suggestedFilename()).toMatch(/^rootbank-statement-kestrel-bend-.+\.pdf$/);
  expect((await readFile(await pdf.path())).subarray(0, 5).toString("latin1")).toBe("%PDF-");

  const [csv] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download CSV" }).click()]);
  expect(csv.suggestedFilename()).toMatch(/\.csv$/);
  const text = (await readFile(await csv.path())).toString("utf8");
  expect(text.split("\r\n")[0]).toBe("section,item,label,field,month,depth_mm,volume_m3,volume_ml,volume_acre_ft,value,unit");
  expect(text).toContain("totals,irrigation_gross,");

  // The same addresses answer with their content types.
  const pdfRes = await page.request.get(`/api/v1/farms/${farmId}/statement.pdf`);
  expect(pdfRes.headers()["content-type"]).toBe("application/pdf");
  const csvRes = await page.request.get(`/api/v1/farms/${farmId}/statement.csv`);
  expect(csvRes.headers()["content-type"]).toMatch(/^text\/csv/);
});

test("a worker is refused the statement, on the page and from the API", async ({ page }) => {
  const farmId = await openKestrelBend(page, DEMO.worker);
  await expect(page.getByRole("navigation", { name: "Farm" }).getByRole("link", { name: "Statement" })).toHaveCount(0);
  const res = await page.goto(`/farms/${farmId}/statement`);
  expect(res?.status()).toBe(403);
  expect((await page.request.get(`/api/v1/farms/${farmId}/statement`)).status()).toBe(403);
  expect((await page.request.get(`/api/v1/farms/${farmId}/statement.pdf`)).status()).toBe(403);
});

test("the owner enters a harvest yield and the statement gives water productivity", async ({ page }) => {
  const farmId = await openKestrelBend(page, DEMO.owner);
  await page.goto(`/farms/${farmId}/statement`);
  await expect(page.getByRole("heading", { name: "Water productivity" })).toBeVisible();
  const enter = page.getByRole("button", { name: /^Enter the yield of / }).first();
  const label = ((await enter.getAttribute("aria-label")) ?? "").replace("Enter the yield of ", "");
  await enter.click();
  await page.getByLabel(`Yield of ${label}, t/ha`).fill("12.5");
  await page.getByRole("button", { name: "Save", exact: true }).click();
  const row = page.getByRole("row", { name: new RegExp(label.split(",")[0]!) }).filter({ hasText: "12.5" });
  await expect(row).toBeVisible();

  // The screen shows what the API now computes for that planting (the arithmetic is checked in tests/integration/statement.test.ts).
  type Row = { plantingId: string; fieldName: string; yieldTHa: number | null; kgPerM3Irrigation: number | null };
  const body = (await (await page.request.get(`/api/v1/farms/${farmId}/statement`)).json()) as { productivity: Row[] };
  const stored = body.productivity.find((p) => p.yieldTHa === 12.5 && label.startsWith(p.fieldName))!;
  expect(stored).toBeDefined();
  if (stored.kgPerM3Irrigation !== null) await expect(row).toContainText(stored.kgPerM3Irrigation.toFixed(2));

  // Put the demo farm back as it was.
  const res = await page.request.patch(`/api/v1/farms/${farmId}/plantings/${stored.plantingId}`, { data: { yieldTHa: null } });
  expect(res.status()).toBe(200);
});
