/**
 * The account API: account days with provenance, the outlook, the farm plan, the map status and the
 * recompute request, against the fixture farm recomputed by the real job code.
 */
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as accountRoute from "@/app/api/v1/farms/[farmId]/fields/[fieldId]/account/route";
import * as outlookRoute from "@/app/api/v1/farms/[farmId]/fields/[fieldId]/outlook/route";
import * as planRoute from "@/app/api/v1/farms/[farmId]/plan/route";
import * as recomputeRoute from "@/app/api/v1/farms/[farmId]/recompute/route";
import * as statusRoute from "@/app/api/v1/farms/[farmId]/status/route";
import { db } from "@/db/knex";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { queue } from "@/lib/jobs/queue";
import { addDaysIso } from "@/lib/waterbalance";
import { call } from "../helpers/api";
import { createFarm } from "../helpers/fixtures";
import { createAccountFarm, dayDate, SPAN_DAYS, type AccountFarm } from "./accounts-fixture";

let farm: AccountFarm;

beforeAll(async () => {
  farm = await createAccountFarm();
  await recomputeFarm(farm.farmId, { today: farm.today });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false, wait: true });
  await db.destroy();
});

const fieldUrl = (fieldId: string, tail: string) => `/api/v1/farms/${farm.farmId}/fields/${fieldId}/${tail}`;

interface AccountBody {
  from: string;
  to: string;
  data: { date: string; depletionStartMm: number; depletionEndMm: number; effectiveRainMm: number; irrigationNetMm: number; capillaryRiseMm: number; etActualMm: number; deepPercolationMm: number; provenance: Record<string, unknown> }[];
}

describe("GET …/fields/:fieldId/account", () => {
  it("gives the last 30 days by default, each with every term and its provenance, closing its books", async () => {
    const res = await call<AccountBody>(accountRoute.GET, fieldUrl(farm.ids.a, "account"), { as: farm.team.viewer, params: { farmId: farm.farmId, fieldId: farm.ids.a } });
    expect(res.status).toBe(200);
    expect(res.body.to).toBe(farm.yesterday);
    expect(res.body.data).toHaveLength(30);
    expect(res.body.data[0]!.date).toBe(addDaysIso(farm.yesterday, -29));
    for (const d of res.body.data) {
      const flow = d.effectiveRainMm + d.irrigationNetMm + d.capillaryRiseMm - d.etActualMm - d.deepPercolationMm;
      expect(Math.abs(d.depletionStartMm - d.depletionEndMm - flow)).toBeLessThanOrEqual(0.01);
      expect(d.provenance).toHaveProperty("eto");
      expect(d.provenance).toHaveProperty("rain");
      expect(d.provenance).toHaveProperty("runoff");
    }
  });

  it("takes from and to, and refuses a reversed span with a 422 naming the parameter", async () => {
    const from = dayDate(farm.start, 0);
    const to = dayDate(farm.start, 9);
    const res = await call<AccountBody>(accountRoute.GET, `${fieldUrl(farm.ids.b, "account")}?from=${from}&to=${to}`, { as: farm.team.worker, params: { farmId: farm.farmId, fieldId: farm.ids.b } });
    expect(res.body.data.map((d) => d.date)).toEqual([...Array(10).keys()].map((i) => dayDate(farm.start, i)));
    const bad = await call(accountRoute.GET, `${fieldUrl(farm.ids.b, "account")}?from=${to}&to=${from}`, { as: farm.team.worker, params: { farmId: farm.farmId, fieldId: farm.ids.b } });
    expect(bad.status).toBe(422);
    expect(bad.body.error?.fields).toHaveProperty("from");
  });

  it("answers 404 for another farm's field and for an unknown field", async () => {
    const otherFarm = await createFarm("Neighbour");
    const [other] = (await db("fields").insert({ farm_id: otherFarm, name: "Theirs", area_ha: 5 }).returning("id")) as { id: string }[];
    for (const fieldId of [other!.id, randomUUID()]) {
      const res = await call(accountRoute.GET, fieldUrl(fieldId, "account"), { as: farm.team.owner, params: { farmId: farm.farmId, fieldId } });
      expect(res.status).toBe(404);
      const o = await call(outlookRoute.GET, fieldUrl(fieldId, "outlook"), { as: farm.team.owner, params: { farmId: farm.farmId, fieldId } });
      expect(o.status).toBe(404);
    }
  });
});

interface OutlookBody {
  lastAccountDate: string;
  triggerDate: string | null;
  dueNow: boolean;
  daysUntilTrigger: number | null;
  netDepthMm: number | null;
  grossDepthMm: number | null;
  grossVolumeM3: number | null;
  runTimeH: number | null;
  days: { date: string; etoMm: number; etoSource: string; depletionStartMm: number; depletionEndMm: number; triggerMm: number }[];
}

describe("GET …/fields/:fieldId/outlook", () => {
  it("projects from the last stored day with forecast ETo where there is one, and recommends depth and run time", async () => {
    const res = await call<OutlookBody>(outlookRoute.GET, `${fieldUrl(farm.ids.a, "outlook")}?days=7`, { as: farm.team.viewer, params: { farmId: farm.farmId, fieldId: farm.ids.a } });
    expect(res.status).toBe(200);
    const o = res.body;
    expect(o.lastAccountDate).toBe(farm.yesterday);
    expect(o.days).toHaveLength(7);
    expect(o.days[0]!.date).toBe(farm.today);
    const last = (await db("account_days").where({ field_id: farm.ids.a, date: farm.yesterday }).first("depletion_end_mm")) as { depletion_end_mm: number };
    expect(o.days[0]!.depletionStartMm).toBeCloseTo(last.depletion_end_mm, 9);
    // The fixture has forecast days (ETo 6 mm given) for the five days after its span, the rest use the recent mean.
    expect(o.days.slice(0, 5).map((d) => [d.etoSource, d.etoMm])).toEqual(Array(5).fill(["forecast", 6]));
    expect(o.days.slice(5).every((d) => d.etoSource === "recent-mean")).toBe(true);
    const first = o.days.findIndex((d) => d.depletionEndMm >= d.triggerMm);
    expect(o.triggerDate).toBe(first >= 0 ? o.days[first]!.date : null);
    if (o.triggerDate !== null) {
      // gross = net / application efficiency (0.85); volume = gross x 40 ha x 10; hours = volume / 250 m³/h
      expect(o.grossDepthMm!).toBeCloseTo(o.netDepthMm! / 0.85, 9);
      expect(o.grossVolumeM3!).toBeCloseTo(o.grossDepthMm! * 40 * 10, 6);
      expect(o.runTimeH!).toBeCloseTo(o.grossVolumeM3! / 250, 9);
    }
  });

  it("refuses days outside 1-60 with a 422", async () => {
    const res = await call(outlookRoute.GET, `${fieldUrl(farm.ids.a, "outlook")}?days=0`, { as: farm.team.viewer, params: { farmId: farm.farmId, fieldId: farm.ids.a } });
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("days");
  });
});

interface PlanBody {
  startDate: string;
  irrigations: { fieldId: string; rank: number; volumeM3: number; allocations: { date: string; volumeM3: number }[] }[];
  notDue: string[];
  capacities: { id: string; m3PerDay: number }[];
}

describe("GET /farms/:farmId/plan", () => {
  it("shares one pump's capacity between the systems that name it, and places no day beyond it", async () => {
    const res = await call<PlanBody>(planRoute.GET, `/api/v1/farms/${farm.farmId}/plan?days=7`, { as: farm.team.agronomist, params: { farmId: farm.farmId } });
    expect(res.status).toBe(200);
    const pump = res.body.capacities.find((c) => c.id === "pump:North pump");
    // the larger of the two systems' daily volumes: 250 m³/h x 24 h
    expect(pump?.m3PerDay).toBe(6000);
    const all = [...res.body.irrigations.map((i) => i.fieldId), ...res.body.notDue].sort();
    expect(all).toEqual([farm.ids.a, farm.ids.b, farm.ids.c].sort());
    const pumpDaily = new Map<string, number>();
    for (const i of res.body.irrigations.filter((i) => i.fieldId !== farm.ids.c)) {
      for (const a of i.allocations) pumpDaily.set(a.date, (pumpDaily.get(a.date) ?? 0) + a.volumeM3);
    }
    for (const used of pumpDaily.values()) expect(used).toBeLessThanOrEqual(6000 + 1e-6);
    expect(res.body.irrigations.map((i) => i.rank)).toEqual(res.body.irrigations.map((_, k) => k + 1));
  });
});

interface StatusBody {
  data: { id: string; name: string; depletionMm: number | null; tawMm: number | null; rawMm: number | null; triggerMm: number | null; daysUntilTrigger: number | null; band: string; lastAccountDate: string | null; dirty: boolean }[];
}

describe("GET /farms/:farmId/status", () => {
  it("gives every field its latest depletion, TAW, RAW, trigger and band", async () => {
    const res = await call<StatusBody>(statusRoute.GET, `/api/v1/farms/${farm.farmId}/status`, { as: farm.team.viewer, params: { farmId: farm.farmId } });
    expect(res.status).toBe(200);
    expect(res.body.data).toHaveLength(3);
    for (const row of res.body.data) {
      const last = (await db("account_days").where({ field_id: row.id, date: farm.yesterday }).first()) as { depletion_end_mm: number; taw_mm: number; raw_mm: number };
      expect(row.lastAccountDate).toBe(farm.yesterday);
      expect(row.depletionMm).toBe(last.depletion_end_mm);
      expect(row.tawMm).toBe(last.taw_mm);
      expect(row.dirty).toBe(false);
      // B's trigger is its MAD 0.4 of TAW; the others trigger at RAW (FAO-56 eq. 83).
      expect(row.triggerMm).toBeCloseTo(row.id === farm.ids.b ? 0.4 * last.taw_mm : last.raw_mm, 9);
      const expected = last.depletion_end_mm > last.raw_mm ? "stressed" : last.depletion_end_mm >= row.triggerMm! ? "due" : null;
      if (expected) expect(row.band).toBe(expected);
      else expect(["drying", "comfortable"]).toContain(row.band);
    }
  });
});

describe("POST /farms/:farmId/recompute", () => {
  it("marks every field from its sowing, audits the request and answers 202", async () => {
    const res = await call(recomputeRoute.POST, `/api/v1/farms/${farm.farmId}/recompute`, { method: "POST", as: farm.team.manager, params: { farmId: farm.farmId } });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ queued: true, fields: 3 });
    const marks = (await db("fields").where({ farm_id: farm.farmId }).pluck("account_dirty_from")) as string[];
    expect(marks).toEqual([farm.start, farm.start, farm.start]);
    const logged = await db("audit_log").where({ farm_id: farm.farmId, action: "recompute" }).count("* as n");
    expect(Number(logged[0]!.n)).toBe(1);
    const result = await recomputeFarm(farm.farmId, { today: farm.today });
    expect(result.days).toBe(3 * SPAN_DAYS);
  });

  it("is refused to a worker (403)", async () => {
    const res = await call(recomputeRoute.POST, `/api/v1/farms/${farm.farmId}/recompute`, { method: "POST", as: farm.team.worker, params: { farmId: farm.farmId } });
    expect(res.status).toBe(403);
  });
});
