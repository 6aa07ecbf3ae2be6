// Figures here are read from the demo farm through the API and compared with the screen (common practice, no source).
import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

const shot = (project: string, name: string) => `tests/artifacts/screens/${project}-${name}.png`;

interface PreviewBody {
  to: string;
  saved: { date: string; depletionMm: number }[];
  edited: { date: string; depletionMm: number }[];
}

test("an agronomist changes Kc mid, sees the what-if, saves with a reason, the account recomputes and the history shows why", async ({
  page,
}, info) => {
  // The first request compiles pages and the worker's recompute runs beside the app on a busy machine.
  test.setTimeout(300_000);
  const farmId = await openKestrelBend(page, DEMO.agronomist);
  await page.getByRole("navigation", { name: "Farm" }).getByRole("link", { name: "Crops" }).click();
  await page.waitForURL(`**/farms/${farmId}/agronomy`);
  await expect(page.getByRole("heading", { name: "Crop settings", level: 1 })).toBeVisible();
  const plantingId = await page.getByLabel("Planting").inputValue();
  const summary = page.getByTestId("preview-summary");
  await expect(summary).toContainText("No edits yet", { timeout: 60_000 });
  await expect(page.getByText("These figures are estimates.")).toBeVisible();

  const kcMid = page.getByLabel("Kc mid", { exact: true });
  const current = Number(await kcMid.inputValue());
  const next = Math.round((current >= 1.3 ? current - 0.1 : current + 0.1) * 100) / 100;
  const answered = page.waitForResponse(
    (r) =>
      r.url().endsWith(`/plantings/${plantingId}/preview`) &&
      (r.request().postData() ?? "").includes('"kcMid"'),
  );
  await kcMid.fill(String(next));
  const preview = (await (await answered).json()) as PreviewBody;
  expect(preview.edited.some((d, k) => Math.abs(d.depletionMm - preview.saved[k]!.depletionMm) > 0.05)).toBe(
    true,
  );
  await expect(summary).toContainText("What-if:");
  await expect(
    page.getByTestId("preview-chart").locator('path.recharts-line-curve[stroke="#1d7f99"]'),
  ).toBeVisible();
  const axe = await new AxeBuilder({ page }).analyze();
  expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical")).toEqual([]);
  await page.screenshot({ path: shot(info.project.name, "agronomy-what-if"), fullPage: true });

  // Nothing is stored before the save.
  const before = await (await page.request.get(`/api/v1/farms/${farmId}/plantings/${plantingId}`)).json();
  expect(before.planting.kcMid).not.toBe(next);

  const reason = `Canopy closed early this season (${info.project.name} check)`;
  await page.getByLabel(/Why this change/).fill(reason);
  await page.getByRole("button", { name: "Save the curve" }).click();
  // The worker may finish before the first look, so either message shows the save went through.
  await expect(page.getByText(/Saved with your reason|has been recomputed with the new curve/)).toBeVisible();
  await expect(page.getByText("has been recomputed with the new curve")).toBeVisible({ timeout: 180_000 });

  const after = await (await page.request.get(`/api/v1/farms/${farmId}/plantings/${plantingId}`)).json();
  expect(after.planting.kcMid).toBe(next);
  const account = await (
    await page.request.get(
      `/api/v1/farms/${farmId}/fields/${after.planting.fieldId}/account?from=${preview.to}&to=${preview.to}`,
    )
  ).json();
  expect(account.data[0].depletionEndMm).toBeCloseTo(preview.edited.at(-1)!.depletionMm, 0);

  await page.getByRole("button", { name: "History", exact: true }).click();
  const latest = page.getByTestId("history-list").getByRole("listitem").first();
  await expect(latest).toContainText(reason);
  await expect(latest).toContainText(`→ ${next}`);
  await expect(
    page.getByTestId("version-compare").locator('tr[data-changed="yes"]').filter({ hasText: "Kc mid" }),
  ).toBeVisible();
  // Nothing pushes the page sideways, on a 390 px phone either.
  expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
  await page.screenshot({ path: shot(info.project.name, "agronomy-history"), fullPage: true });
});

test("a worker has no crop settings: no link, a 403 page and refused routes", async ({ page }) => {
  test.setTimeout(120_000);
  const farmId = await openKestrelBend(page, DEMO.worker);
  await expect(
    page.getByRole("navigation", { name: "Farm" }).getByRole("link", { name: "Crops" }),
  ).toHaveCount(0);
  const res = await page.goto(`/farms/${farmId}/agronomy`);
  expect(res?.status()).toBe(403);
  const plantings = await (await page.request.get(`/api/v1/farms/${farmId}/plantings?limit=1`)).json();
  const id = plantings.data[0].id as string;
  expect(
    (await page.request.post(`/api/v1/farms/${farmId}/plantings/${id}/preview`, { data: {} })).status(),
  ).toBe(403);
  expect(
    (
      await page.request.post(`/api/v1/farms/${farmId}/plantings/${id}/curve`, {
        data: { changes: { kcMid: 1.1 }, reason: "not mine" },
      })
    ).status(),
  ).toBe(403);
});
