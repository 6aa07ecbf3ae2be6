/**
 * Tuning the crop: the what-if preview stores nothing; saving a curve needs a reason, is audited with
 * the values before and after, marks the field and the recompute changes the account; calibration
 * finds the Kc scale a synthetic field used; workers are refused and agronomists cannot edit systems.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as preview from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/preview/route";
import * as curve from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/curve/route";
import * as history from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/history/route";
import * as calibration from "@/app/api/v1/farms/[farmId]/plantings/[plantingId]/calibration/route";
import * as cropHistory from "@/app/api/v1/farms/[farmId]/crops/[cropId]/history/route";
import * as cropItem from "@/app/api/v1/farms/[farmId]/crops/[cropId]/route";
import * as systemItem from "@/app/api/v1/farms/[farmId]/systems/[systemId]/route";
import { db } from "@/db/knex";
import { loadPlantingSeason } from "@/lib/agronomy/season";
import { recomputeFarm } from "@/lib/accounts/recompute";
import { queue } from "@/lib/jobs/queue";
import { addDaysIso } from "@/lib/waterbalance";
import { call } from "../helpers/api";
import { createAccountFarm, type AccountFarm } from "./accounts-fixture";

let farm: AccountFarm;
const base = () => `/api/v1/farms/${farm.farmId}/plantings/${farm.ids.pa}`;
const params = () => ({ farmId: farm.farmId, plantingId: farm.ids.pa });

interface PreviewBody {
  saved: { date: string; depletionMm: number; triggerMm: number }[];
  edited: { date: string; depletionMm: number }[];
  kcUsed: { saved: { mid: number } | null; edited: { mid: number } | null };
  estimate: boolean;
}

async function storedDays(fieldId: string): Promise<Map<string, number>> {
  const rows = (await db("account_days").where({ field_id: fieldId }).select("date", "depletion_end_mm")) as {
    date: string;
    depletion_end_mm: number;
  }[];
  return new Map(rows.map((r) => [r.date, r.depletion_end_mm]));
}

beforeAll(async () => {
  farm = await createAccountFarm();
  await recomputeFarm(farm.farmId, { all: true, today: farm.today });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false, wait: true });
  await db.destroy();
});

describe("what-if preview", () => {
  it("re-runs the season with the edited Kc mid beside the saved account, and stores nothing", async () => {
    const before = {
      days: await storedDays(farm.ids.a),
      planting: await db("plantings").where({ id: farm.ids.pa }).first(),
      audits: Number(((await db("audit_log").count({ n: "*" })) as [{ n: string }])[0].n),
      field: await db("fields").where({ id: farm.ids.a }).first("account_dirty_from"),
    };
    const res = await call<PreviewBody>(preview.POST, `${base()}/preview`, {
      method: "POST",
      as: farm.team.agronomist,
      params: params(),
      body: { kcMid: 1.4 },
    });
    expect(res.status).toBe(200);
    expect(res.body.estimate).toBe(true);
    // The saved line is the stored account (to its 0.1 mm rounding).
    expect(res.body.saved.length).toBe(before.days.size);
    for (const d of res.body.saved) expect(d.depletionMm).toBeCloseTo(before.days.get(d.date)!, 1);
    // A higher Kc mid dries the field faster somewhere in the season, and the climate-adjusted value moves with it.
    const drier = res.body.edited.some((d, k) => d.depletionMm > res.body.saved[k]!.depletionMm + 0.5);
    expect(drier).toBe(true);
    expect(res.body.kcUsed.edited!.mid - res.body.kcUsed.saved!.mid).toBeCloseTo(0.2, 6);
    // Nothing stored.
    expect(await storedDays(farm.ids.a)).toEqual(before.days);
    expect(await db("plantings").where({ id: farm.ids.pa }).first()).toEqual(before.planting);
    expect(Number(((await db("audit_log").count({ n: "*" })) as [{ n: string }])[0].n)).toBe(before.audits);
    expect(await db("fields").where({ id: farm.ids.a }).first("account_dirty_from")).toEqual(before.field);
  });

  it("names a bad value, never a 500", async () => {
    const res = await call(preview.POST, `${base()}/preview`, {
      method: "POST",
      as: farm.team.agronomist,
      params: params(),
      body: { kcMid: 3 },
    });
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("kcMid");
  });
});

describe("saving the curve", () => {
  it("needs a reason", async () => {
    const res = await call(curve.POST, `${base()}/curve`, {
      method: "POST",
      as: farm.team.agronomist,
      params: params(),
      body: { changes: { kcMid: 1.4 } },
    });
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("reason");
    expect((await db("plantings").where({ id: farm.ids.pa }).first("kc_mid")).kc_mid).toBeNull();
  });

  it("writes the planting and the audit with before/after and reason, marks the field, and the recompute changes the account", async () => {
    const edited = await call<PreviewBody>(preview.POST, `${base()}/preview`, {
      method: "POST",
      as: farm.team.agronomist,
      params: params(),
      body: { kcMid: 1.4 },
    });
    const stored = await storedDays(farm.ids.a);
    const reason = "Probe readings dried faster than the account in December";
    const res = await call<{ planting: { kcMid: number } }>(curve.POST, `${base()}/curve`, {
      method: "POST",
      as: farm.team.agronomist,
      params: params(),
      body: { changes: { kcMid: 1.4 }, reason },
    });
    expect(res.status).toBe(200);
    expect(res.body.planting.kcMid).toBe(1.4);
    const entry = (await db("audit_log")
      .where({ entity: "planting", entity_id: farm.ids.pa })
      .orderBy("id", "desc")
      .first()) as {
      user_id: string;
      reason: string;
      before: { kcMid: number | null };
      after: { kcMid: number };
    };
    expect(entry.user_id).toBe(farm.team.agronomist.id);
    expect(entry.reason).toBe(reason);
    expect(entry.before.kcMid).toBeNull();
    expect(entry.after.kcMid).toBe(1.4);
    const field = (await db("fields").where({ id: farm.ids.a }).first("account_dirty_from")) as {
      account_dirty_from: string;
    };
    expect(field.account_dirty_from).toBe(farm.start);

    await recomputeFarm(farm.farmId, { today: farm.today });
    const after = await storedDays(farm.ids.a);
    expect([...after.entries()].some(([date, mm]) => Math.abs(mm - stored.get(date)!) > 0.5)).toBe(true);
    // The recomputed account is the line the preview drew.
    for (const d of edited.body.edited) expect(after.get(d.date)!).toBeCloseTo(d.depletionMm, 1);

    const hist = await call<{
      data: { reason: string; userName: string; before: { kcMid: unknown }; after: { kcMid: unknown } }[];
    }>(history.GET, `${base()}/history`, {
      as: farm.team.owner,
      params: params(),
    });
    expect(hist.status).toBe(200);
    expect(hist.body.data[0]).toMatchObject({
      reason,
      userName: farm.team.agronomist.name,
      before: { kcMid: null },
      after: { kcMid: 1.4 },
    });
  });
});

describe("calibration from soil checks", () => {
  it("suggests ≈ 1.2 for checks generated by the account itself with Kc × 1.2, and accepting stores it with the reason", async () => {
    // Synthetic field: the engine's own depletion with the planting's Kc × 1.2 on six days (common practice, no source).
    await db("soil_checks").where({ field_id: farm.ids.b }).delete();
    const season = await loadPlantingSeason(farm.farmId, farm.ids.pb, farm.today);
    const truth = season.run({ ...season.saved, kcScale: 1.2 })!;
    const carried = new Map(truth.days.map((d) => [d.date, d.carriedDepletionMm]));
    const dates = [8, 16, 24, 33, 45, 52].map((i) => addDaysIso(farm.start, i));
    await db("soil_checks").insert(
      dates.map((date) => ({
        field_id: farm.ids.b,
        date,
        depletion_mm: carried.get(date)!,
        method: "probe",
      })),
    );

    const p = { farmId: farm.farmId, plantingId: farm.ids.pb };
    const url = `/api/v1/farms/${farm.farmId}/plantings/${farm.ids.pb}/calibration`;
    const res = await call<{
      checks: { observedMm: number; modelledMm: number }[];
      stats: { n: number; meanErrorMm: number; rmseMm: number; maeMm: number };
      suggestion: { scale: number; withScale: { rmseMm: number } };
    }>(calibration.GET, url, { as: farm.team.agronomist, params: p });
    expect(res.status).toBe(200);
    expect(res.body.stats.n).toBe(6);
    expect(res.body.checks).toHaveLength(6);
    // Unscaled, the account is wetter than the synthetic field: negative bias.
    expect(res.body.stats.meanErrorMm).toBeLessThan(0);
    expect(res.body.suggestion.scale).toBeGreaterThanOrEqual(1.18);
    expect(res.body.suggestion.scale).toBeLessThanOrEqual(1.22);
    expect(res.body.suggestion.withScale.rmseMm).toBeLessThan(res.body.stats.rmseMm);

    const refused = await call(calibration.POST, url, {
      method: "POST",
      as: farm.team.agronomist,
      params: p,
      body: { kcScale: 1.2 },
    });
    expect(refused.status).toBe(422);
    const reason = "Six probe checks say the crop uses about a fifth more than the table";
    const ok = await call<{ planting: { kcScale: number } }>(calibration.POST, url, {
      method: "POST",
      as: farm.team.agronomist,
      params: p,
      body: { kcScale: 1.2, reason },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.planting.kcScale).toBe(1.2);
    const entry = (await db("audit_log")
      .where({ entity: "planting", entity_id: farm.ids.pb })
      .orderBy("id", "desc")
      .first()) as {
      reason: string;
      after: { kcScale: number };
    };
    expect(entry).toMatchObject({ reason, after: { kcScale: 1.2 } });
    // The recompute runs the engine with the stored scale: the checks now sit on the account.
    await recomputeFarm(farm.farmId, { today: farm.today });
    const again = await call<{ stats: { rmseMm: number } }>(calibration.GET, url, {
      as: farm.team.agronomist,
      params: p,
    });
    expect(again.body.stats.rmseMm).toBeLessThan(0.5);
  });
});

describe("who may tune", () => {
  it("refuses a worker on every agronomy route", async () => {
    const w = farm.team.worker;
    expect(
      (await call(preview.POST, `${base()}/preview`, { method: "POST", as: w, params: params(), body: {} }))
        .status,
    ).toBe(403);
    expect(
      (
        await call(curve.POST, `${base()}/curve`, {
          method: "POST",
          as: w,
          params: params(),
          body: { changes: { kcMid: 1 }, reason: "try" },
        })
      ).status,
    ).toBe(403);
    expect((await call(history.GET, `${base()}/history`, { as: w, params: params() })).status).toBe(403);
    expect((await call(calibration.GET, `${base()}/calibration`, { as: w, params: params() })).status).toBe(
      403,
    );
    expect((await db("plantings").where({ id: farm.ids.pa }).first("kc_mid")).kc_mid).toBe(1.4);
  });

  it("lets an agronomist edit crop settings but not irrigation systems", async () => {
    const a = farm.team.agronomist;
    const crop = await call(cropItem.PATCH, `/api/v1/farms/${farm.farmId}/crops/${farm.ids.crop}`, {
      method: "PATCH",
      as: a,
      params: { farmId: farm.farmId, cropId: farm.ids.crop },
      body: { kcEnd: 0.4, reason: "Harvested green, not dried in the field" },
    });
    expect(crop.status).toBe(200);
    const hist = await call<{
      data: { reason: string; before: { kcEnd: number }; after: { kcEnd: number } }[];
    }>(cropHistory.GET, `/api/v1/farms/${farm.farmId}/crops/${farm.ids.crop}/history`, {
      as: a,
      params: { farmId: farm.farmId, cropId: farm.ids.crop },
    });
    expect(hist.body.data[0]).toMatchObject({
      reason: "Harvested green, not dried in the field",
      before: { kcEnd: 0.35 },
      after: { kcEnd: 0.4 },
    });
    const system = await call(systemItem.PATCH, `/api/v1/farms/${farm.farmId}/systems/${farm.ids.s1}`, {
      method: "PATCH",
      as: a,
      params: { farmId: farm.farmId, systemId: farm.ids.s1 },
      body: { applicationEfficiency: 0.9 },
    });
    expect(system.status).toBe(403);
  });
});
