/**
 * The season statement against the fixture farm recomputed by the real job code: its totals are the
 * stored account days summed again here in SQL, the balance closes, the CSV and the PDF carry the same
 * figures, the e-mail arrives with the PDF, and roles are checked.
 */
import Papa from "papaparse";
import { PDFParse } from "pdf-parse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as statementRoute from "@/app/api/v1/farms/[farmId]/statement/route";
import * as csvRoute from "@/app/api/v1/farms/[farmId]/statement.csv/route";
import * as pdfRoute from "@/app/api/v1/farms/[farmId]/statement.pdf/route";
import * as sendRoute from "@/app/api/v1/farms/[farmId]/statement/send/route";
import * as plantingRoute from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/route";
import { db } from "@/db/knex";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { queue } from "@/lib/jobs/queue";
import { formatNumber } from "@/lib/statement/format";
import type { Statement } from "@/lib/statement/types";
import { BASE, call, sessionCookie } from "../helpers/api";
import { waitForMail } from "../helpers/inbox";
import { createAccountFarm, type AccountFarm } from "./accounts-fixture";

let farm: AccountFarm;
let waterYear: number;
/** harvested yield entered for field A's planting, t/ha (invented fixture value) */
const YIELD_T_HA = 11.5;

beforeAll(async () => {
  farm = await createAccountFarm();
  // The fixture's 60 days all fall in the water year that starts in the month of its first day.
  waterYear = Number(farm.start.slice(0, 4));
  await db("farms").where({ id: farm.farmId }).update({ water_year_start_month: Number(farm.start.slice(5, 7)) });
  await recomputeFarm(farm.farmId, { today: farm.today });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false, wait: true });
  await db.destroy();
});

const url = (tail = "", query = "") => `/api/v1/farms/${farm.farmId}/statement${tail}${query ? `?${query}` : ""}`;
const params = () => ({ farmId: farm.farmId });

/** Calls a download route and keeps the body's bytes (the JSON helper would decode them as text). */
async function download(handler: unknown, path: string, as: { id: string; email: string; name: string }) {
  const { NextRequest } = await import("next/server");
  const req = new NextRequest(`${BASE}${path}`, { headers: { cookie: await sessionCookie(as) } });
  const res = await (handler as (r: unknown, c: unknown) => Promise<Response>)(req, { params: Promise.resolve(params()) });
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
}

interface SqlSums {
  area_ha: number;
  field_days: number;
  rain_m3: number;
  runoff_m3: number;
  eff_m3: number;
  gross_m3: number;
  net_m3: number;
  cr_m3: number;
  etc_m3: number;
  eta_m3: number;
  dp_m3: number;
  ds_m3: number;
}

/**
 * The same totals, summed straight from account_days: each day's depth times its field's area, with
 * 1 mm over 1 ha = 10 m³ (0.001 m × 10,000 m²; arithmetic, no source needed).
 */
async function sqlSums(filter: { fieldId?: string; plantingIds?: string[] } = {}): Promise<SqlSums> {
  const field = filter.fieldId ?? null;
  const plantings = filter.plantingIds ? `{${filter.plantingIds.join(",")}}` : null;
  const where = "f.farm_id = ? and (cast(? as uuid) is null or a.field_id = cast(? as uuid)) and (cast(? as uuid[]) is null or a.planting_id = any(cast(? as uuid[])))";
  const args = [farm.farmId, field, field, plantings, plantings];
  const { rows } = await db.raw<{ rows: SqlSums[] }>(
    `select
       (select coalesce(sum(f.area_ha), 0) from fields f where f.id in (
          select distinct a.field_id from account_days a join fields f on f.id = a.field_id where ${where})) as area_ha,
       count(*)::int as field_days,
       sum(a.rain_mm * f.area_ha * 10) as rain_m3,
       sum(a.runoff_mm * f.area_ha * 10) as runoff_m3,
       sum(a.effective_rain_mm * f.area_ha * 10) as eff_m3,
       sum(a.irrigation_gross_mm * f.area_ha * 10) as gross_m3,
       sum(a.irrigation_net_mm * f.area_ha * 10) as net_m3,
       sum(a.capillary_rise_mm * f.area_ha * 10) as cr_m3,
       sum(a.etc_mm * f.area_ha * 10) as etc_m3,
       sum(a.et_actual_mm * f.area_ha * 10) as eta_m3,
       sum(a.deep_percolation_mm * f.area_ha * 10) as dp_m3,
       sum((a.depletion_start_mm - a.depletion_end_mm) * f.area_ha * 10) as ds_m3
     from account_days a join fields f on f.id = a.field_id
     where ${where}`,
    [...args, ...args],
  );
  const r = rows[0]!;
  return Object.fromEntries(Object.entries(r).map(([k, v]) => [k, Number(v)])) as unknown as SqlSums;
}

/** Statement line → the SQL column it must equal. */
const LINE_OF: [keyof Statement["totals"]["lines"], (s: SqlSums) => number][] = [
  ["rain", (s) => s.rain_m3],
  ["runoff", (s) => s.runoff_m3],
  ["effectiveRain", (s) => s.eff_m3],
  ["irrigationGross", (s) => s.gross_m3],
  ["irrigationNet", (s) => s.net_m3],
  ["applicationLoss", (s) => s.gross_m3 - s.net_m3],
  ["capillaryRise", (s) => s.cr_m3],
  ["etc", (s) => s.etc_m3],
  ["etActual", (s) => s.eta_m3],
  ["deepPercolation", (s) => s.dp_m3],
  ["storageChange", (s) => s.ds_m3],
];

function expectTotalsMatch(body: Statement, sql: SqlSums): void {
  expect(body.totals.fieldDays).toBe(sql.field_days);
  expect(body.totals.areaHa).toBeCloseTo(sql.area_ha, 9);
  for (const [line, of] of LINE_OF) {
    const q = body.totals.lines[line];
    expect(q.volumeM3, line).toBeCloseTo(of(sql), 4);
    expect(q.depthMm, line).toBeCloseTo(of(sql) / (10 * sql.area_ha), 6);
  }
}

describe("GET …/statement (JSON)", () => {
  it("totals the whole farm's stored account days for the water year, in mm, m³, ML and acre-feet", async () => {
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.viewer, params: params() });
    expect(res.status).toBe(200);
    const s = res.body;
    expect(s.period).toMatchObject({ kind: "water-year", year: waterYear, from: `${farm.start.slice(0, 7)}-01` });
    expect(s.field).toBeNull();
    const sql = await sqlSums();
    expect(sql.field_days).toBeGreaterThan(0);
    expectTotalsMatch(s, sql);
    // The fixture irrigates all three fields and rains on them: the statement is not all zeros.
    expect(s.totals.lines.irrigationGross.volumeM3).toBeGreaterThan(0);
    expect(s.totals.lines.rain.volumeM3).toBeGreaterThan(0);
    expect(s.fields.map((f) => f.name).sort()).toEqual(["A own gauge", "B nearby gauges", "C tipping bucket"]);
    const last = (await db("account_days as a").join("fields as f", "f.id", "a.field_id").where("f.farm_id", farm.farmId).max({ d: "a.date" }).first()) as { d: string };
    expect(s.totals.lastDate).toBe(last.d);
    expect(s.estimate).toBe(true);
  });

  it("closes the balance to the millimetre, and shows the closure figure", async () => {
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.owner, params: params() });
    const sql = await sqlSums();
    const closureM3 = sql.eff_m3 + sql.net_m3 + sql.cr_m3 - sql.eta_m3 - sql.dp_m3 - sql.ds_m3;
    expect(res.body.totals.closure.volumeM3).toBeCloseTo(closureM3, 4);
    // Every stored day closes to 0.01 mm (DESIGN.md invariant), so the season closes well within 1 mm.
    expect(Math.abs(res.body.totals.closure.depthMm)).toBeLessThan(0.5);
    for (const f of res.body.fields) expect(Math.abs(f.closure.depthMm), f.name).toBeLessThan(0.5);
  });

  it("converts with the named factors: 1 ML = 1,000 m³ and 1 acre-foot = 1,233.48 m³", async () => {
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.owner, params: params() });
    // 1 ML = 10^6 L = 1,000 m³ (SI prefix mega; 1 m³ = 1,000 L by definition of the litre, CGPM 1964).
    const M3_PER_ML = 1000;
    // 1 acre-foot = 43,560 ft³ (USGS Water Science School, "How much water is an acre-foot?") and
    // 1 ft = 0.3048 m exactly (international yard and pound agreement, 1959): 1,233.48 m³ to the litre.
    // The statement uses that figure rounded to 1,233.48 m³ (also REFERENCES: 1,233.5 m³).
    expect(43_560 * 0.3048 ** 3).toBeCloseTo(1233.48, 2);
    const M3_PER_ACRE_FOOT = 1233.48;
    for (const [line] of LINE_OF) {
      const q = res.body.totals.lines[line];
      expect(q.volumeMl, line).toBeCloseTo(q.volumeM3 / M3_PER_ML, 9);
      expect(q.volumeAcreFt, line).toBeCloseTo(q.volumeM3 / M3_PER_ACRE_FOOT, 5);
    }
  });

  it("gives one field's statement from that field's days only", async () => {
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}&fieldId=${farm.ids.a}`), { as: farm.team.agronomist, params: params() });
    expect(res.status).toBe(200);
    expect(res.body.field).toMatchObject({ id: farm.ids.a, areaHa: 40 });
    const sql = await sqlSums({ fieldId: farm.ids.a });
    expectTotalsMatch(res.body, sql);
    // Fixture: 25 mm gross logged on field A (accounts-fixture.ts), the only irrigation there.
    expect(res.body.totals.lines.irrigationGross.depthMm).toBeCloseTo(25, 6);
  });

  it("gives a crop season from its plantings' days", async () => {
    const res = await call<Statement>(statementRoute.GET, url("", "season=fixture"), { as: farm.team.manager, params: params() });
    expect(res.status).toBe(200);
    expect(res.body.period).toMatchObject({ kind: "season", season: "fixture", from: farm.start });
    expectTotalsMatch(res.body, await sqlSums({ plantingIds: [farm.ids.pa, farm.ids.pb, farm.ids.pc] }));
    expect(res.body.choices.seasons.map((s) => s.season)).toContain("fixture");
  });

  it("measures use month by month against allocation + carryover, warning from 80 %", async () => {
    const used = (await sqlSums()).gross_m3 / 1000;
    // Allocation chosen so that use is 90 % of allocation + carryover (invented fixture values).
    const carryoverMl = 2;
    const allocationMl = used / 0.9 - carryoverMl;
    await db("farms").where({ id: farm.farmId }).update({ allocation_ml: allocationMl, carryover_ml: carryoverMl });
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.owner, params: params() });
    const a = res.body.allocation;
    expect(a.limitMl).toBeCloseTo(allocationMl + carryoverMl, 9);
    expect(a.usedMl).toBeCloseTo(used, 6);
    expect(a.shareUsed).toBeCloseTo(0.9, 6);
    expect(a.level).toBe("approaching");
    expect(a.months).toHaveLength(12);
    const { rows } = await db.raw<{ rows: { month: string; m3: number }[] }>(
      `select to_char(a.date, 'YYYY-MM') as month, sum(a.irrigation_gross_mm * f.area_ha * 10) as m3
       from account_days a join fields f on f.id = a.field_id where f.farm_id = ? group by 1 order by 1`,
      [farm.farmId],
    );
    let cumulative = 0;
    for (const r of rows) {
      cumulative += Number(r.m3) / 1000;
      const m = a.months.find((x) => x.month === r.month)!;
      expect(m.useM3, r.month).toBeCloseTo(Number(r.m3), 4);
      expect(m.cumulativeMl, r.month).toBeCloseTo(cumulative, 6);
    }
    // Months after the last account day are not yet used.
    expect(a.months.at(-1)!.cumulativeMl).toBeNull();

    await db("farms").where({ id: farm.farmId }).update({ allocation_ml: used / 1.1, carryover_ml: 0 });
    const over = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.owner, params: params() });
    expect(over.body.allocation.level).toBe("reached");
  });

  it("takes a yield through the planting API and gives water productivity in kg/m³", async () => {
    const patch = await call(plantingRoute.PATCH, `/api/v1/farms/${farm.farmId}/plantings/${farm.ids.pa}`, {
      method: "PATCH",
      as: farm.team.agronomist,
      params: { farmId: farm.farmId, plantingId: farm.ids.pa },
      body: { yieldTHa: YIELD_T_HA },
    });
    expect(patch.status).toBe(200);
    expect((patch.body as { planting: { yieldTHa: number } }).planting.yieldTHa).toBe(YIELD_T_HA);
    const res = await call<Statement>(statementRoute.GET, url("", `waterYear=${waterYear}`), { as: farm.team.owner, params: params() });
    const a = res.body.productivity.find((p) => p.plantingId === farm.ids.pa)!;
    const sql = await sqlSums({ plantingIds: [farm.ids.pa] });
    // t/ha × 1,000 kg/t × 40 ha (field A's area in the fixture)
    const yieldKg = YIELD_T_HA * 1000 * 40;
    expect(a.yieldKg).toBeCloseTo(yieldKg, 6);
    expect(a.kgPerM3Irrigation).toBeCloseTo(yieldKg / sql.gross_m3, 6);
    expect(a.kgPerM3Et).toBeCloseTo(yieldKg / sql.eta_m3, 6);
    expect(res.body.productivity.find((p) => p.plantingId === farm.ids.pb)!.kgPerM3Irrigation).toBeNull();

    const bad = await call(plantingRoute.PATCH, `/api/v1/farms/${farm.farmId}/plantings/${farm.ids.pa}`, {
      method: "PATCH",
      as: farm.team.agronomist,
      params: { farmId: farm.farmId, plantingId: farm.ids.pa },
      body: { yieldTHa: -1 },
    });
    expect(bad.status).toBe(422);
    expect(bad.body.error?.fields).toHaveProperty("yieldTHa");
  });

  it("refuses a bad choice with a 422 naming it, and an unknown field or season with a 404", async () => {
    const both = await call(statementRoute.GET, url("", `waterYear=${waterYear}&season=fixture`), { as: farm.team.owner, params: params() });
    expect(both.status).toBe(422);
    expect(both.body.error?.fields).toHaveProperty("season");
    const notYear = await call(statementRoute.GET, url("", "waterYear=soon"), { as: farm.team.owner, params: params() });
    expect(notYear.status).toBe(422);
    expect(notYear.body.error?.fields).toHaveProperty("waterYear");
    const otherField = await call(statementRoute.GET, url("", "fieldId=00000000-0000-4000-8000-000000000000"), { as: farm.team.owner, params: params() });
    expect(otherField.status).toBe(404);
    const noSeason = await call(statementRoute.GET, url("", "season=never"), { as: farm.team.owner, params: params() });
    expect(noSeason.status).toBe(404);
  });
});

describe("downloads", () => {
  it("CSV parses and carries the same totals", async () => {
    const res = await download(csvRoute.GET, url(".csv", `waterYear=${waterYear}`), farm.team.owner);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename=".+\.csv"/);
    const parsed = Papa.parse<Record<string, string>>(res.bytes.toString("utf8"), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const totals = (item: string) => parsed.data.find((r) => r.section === "totals" && r.item === item)!;
    const sql = await sqlSums();
    const csvItem: Record<string, string> = {
      rain: "rain", runoff: "runoff", effectiveRain: "effective_rain", irrigationGross: "irrigation_gross", irrigationNet: "irrigation_net",
      applicationLoss: "application_loss", capillaryRise: "capillary_rise", etc: "etc", etActual: "et_actual", deepPercolation: "deep_percolation", storageChange: "storage_change",
    };
    for (const [line, of] of LINE_OF) {
      const row = totals(csvItem[line]!);
      // The CSV rounds m³ to 0.1 and mm to 0.01.
      expect(Math.abs(Number(row.volume_m3) - of(sql)), line).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(Number(row.depth_mm) - of(sql) / (10 * sql.area_ha)), line).toBeLessThanOrEqual(0.005 + 1e-9);
    }
    expect(Math.abs(Number(totals("closure").depth_mm))).toBeLessThan(0.5);
    expect(parsed.data.filter((r) => r.section === "allocation" && r.item === "month_use").length).toBeGreaterThan(0);
  });

  it("PDF is a real PDF whose text holds the same totals", async () => {
    const res = await download(pdfRoute.GET, url(".pdf", `waterYear=${waterYear}`), farm.team.viewer);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const parser = new PDFParse({ data: new Uint8Array(res.bytes) });
    const { text } = await parser.getText();
    await parser.destroy();
    const sql = await sqlSums();
    expect(text).toContain("Season water statement");
    expect(text).toContain(formatNumber(sql.rain_m3 / (10 * sql.area_ha), 1));
    expect(text).toContain(formatNumber(sql.gross_m3, 0));
    expect(text).toContain(formatNumber(sql.gross_m3 / 1000, 2));
    expect(text).toContain(formatNumber(sql.eta_m3, 0));
    expect(text).toMatch(/closes to -?0\.0 mm/);
    expect(text).toMatch(/estimates/i);
  });

  it("?format=pdf on the statement itself answers the same PDF", async () => {
    const res = await download(statementRoute.GET, url("", `waterYear=${waterYear}&format=pdf`), farm.team.owner);
    expect(res.status).toBe(200);
    expect(res.bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
  });
});

describe("POST …/statement/send", () => {
  it("e-mails the PDF to the sender", async () => {
    const res = await call<{ sent: boolean; to: string; filename: string }>(sendRoute.POST, url("/send"), {
      method: "POST",
      as: farm.team.owner,
      params: params(),
      body: { waterYear },
    });
    expect(res.status).toBe(200);
    expect(res.body.to).toBe(farm.team.owner.email);
    const mail = await waitForMail(farm.team.owner.email, /Season water statement/);
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]).toMatchObject({ contentType: "application/pdf", filename: res.body.filename });
    expect(mail.attachments[0]!.size).toBeGreaterThan(1000);
    expect(mail.text).toMatch(/estimates/);
  });

  it("sends to another member of the farm, never to an outside address", async () => {
    const ok = await call(sendRoute.POST, url("/send"), { method: "POST", as: farm.team.owner, params: params(), body: { waterYear, to: farm.team.viewer.email } });
    expect(ok.status).toBe(200);
    await waitForMail(farm.team.viewer.email, /Season water statement/);
    const outside = await call(sendRoute.POST, url("/send"), { method: "POST", as: farm.team.owner, params: params(), body: { to: farm.team.outsider.email } });
    expect(outside.status).toBe(422);
    expect(outside.body.error?.fields).toHaveProperty("to");
  });
});

describe("who may read it", () => {
  const routes = [
    { method: "GET", handler: statementRoute.GET, tail: "" },
    { method: "GET", handler: csvRoute.GET, tail: ".csv" },
    { method: "GET", handler: pdfRoute.GET, tail: ".pdf" },
    { method: "POST", handler: sendRoute.POST, tail: "/send" },
  ] as const;

  it.each(routes)("$method statement$tail: a worker gets 403, another farm's member 404", async ({ method, handler, tail }) => {
    const worker = await call(handler, url(tail), { method, as: farm.team.worker, params: params(), body: method === "POST" ? {} : undefined });
    expect(worker.status).toBe(403);
    const outsider = await call(handler, url(tail), { method, as: farm.team.outsider, params: params(), body: method === "POST" ? {} : undefined });
    expect(outsider.status).toBe(404);
  });
});
