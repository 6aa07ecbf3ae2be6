/**
 * PATCH /api/v1/farms/:farmId: settings need editSetup, the allocation editAllocation; each part checked.
 */
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as farmRoute from "@/app/api/v1/farms/[farmId]/route";
import { db } from "@/db/knex";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

let team: FarmTeam;
let otherFarmId: string;
let fieldId: string;

interface Body {
  farm?: Record<string, unknown>;
  error?: { code: string; message: string; fields?: Record<string, string> };
}

const patch = (body: Record<string, unknown>, as = team.manager) =>
  call<Body>(farmRoute.PATCH, `/api/v1/farms/${team.farmId}`, { method: "PATCH", as, params: { farmId: team.farmId }, body });

beforeAll(async () => {
  team = await createFarmTeam();
  otherFarmId = (await db("memberships").where({ user_id: team.outsider.id }).first("farm_id")).farm_id;
  const [{ id: cropId }] = await db("crops")
    .insert({ farm_id: team.farmId, name: "Fixture wheat", kc_ini: 0.3, kc_mid: 1.15, kc_end: 0.25, stage_ini_days: 20, stage_dev_days: 30, stage_mid_days: 40, stage_late_days: 30, root_min_m: 0.15, root_max_m: 1.0, p: 0.55 })
    .returning("id");
  [{ id: fieldId }] = await db("fields").insert({ farm_id: team.farmId, name: "Wheat block", area_ha: 50 }).returning("id");
  await db("plantings").insert({ field_id: fieldId, season: "2026", crop_id: cropId, planting_date: "2026-05-20" });
});

afterAll(async () => {
  const g = globalThis as { rootbankBoss?: Promise<PgBoss> };
  if (g.rootbankBoss) await (await g.rootbankBoss).stop({ graceful: false, wait: true });
  await db("plantings").where({ field_id: fieldId }).delete();
  await db("fields").where({ id: fieldId }).delete();
  await db("farms").whereIn("id", [team.farmId, otherFarmId]).delete();
  await db.destroy();
});

describe("PATCH /api/v1/farms/:farmId", () => {
  it("lets a manager rename the farm without touching the accounts, audited", async () => {
    const res = await patch({ name: "Renamed farm", unitSystem: "imperial" });
    expect(res.status).toBe(200);
    expect(res.body.farm).toMatchObject({ name: "Renamed farm", unitSystem: "imperial", timeZone: "Australia/Sydney" });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: null });
    const audit = await db("audit_log").where({ entity: "farm", entity_id: team.farmId }).orderBy("id").select("action", "user_id", "before", "after");
    expect(audit.at(-1)).toMatchObject({ action: "update", user_id: team.manager.id, before: { unitSystem: "metric" }, after: { name: "Renamed farm", unitSystem: "imperial" } });
  });

  it("marks every planted field stale from its planting date when the time zone or rain-day hour changes", async () => {
    const res = await patch({ timeZone: "Australia/Brisbane", rainDayBoundaryHour: 8 });
    expect(res.status).toBe(200);
    expect(res.body.farm).toMatchObject({ timeZone: "Australia/Brisbane", rainDayBoundaryHour: 8 });
    expect(await db("fields").where({ id: fieldId }).first("account_dirty_from")).toEqual({ account_dirty_from: "2026-05-20" });
    const jobs = await db("jobs.job").where({ name: "recompute", singleton_key: team.farmId }).count({ n: "*" });
    expect(Number(jobs[0]!.n)).toBeGreaterThan(0);
  });

  it("names the setting that is not valid", async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ timeZone: "Sydney" }, "timeZone"],
      [{ timeZone: "Mars/Olympus_Mons" }, "timeZone"],
      [{ rainDayBoundaryHour: 24 }, "rainDayBoundaryHour"],
      [{ rainDayBoundaryHour: 8.5 }, "rainDayBoundaryHour"],
      [{ latitude: 123 }, "latitude"],
      [{ unitSystem: "furlongs" }, "unitSystem"],
      [{ allocationMl: -5 }, "allocationMl"],
      [{ waterYearStartMonth: 13 }, "waterYearStartMonth"],
      [{ name: "  " }, "name"],
      [{ owner: "me" }, "_"],
    ];
    for (const [body, field] of cases) {
      const res = await patch(body, team.owner);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error!.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
  });

  it("changes the allocation for an owner or manager", async () => {
    const res = await patch({ allocationMl: 1250, carryoverMl: 80, waterYearStartMonth: 7 }, team.owner);
    expect(res.status).toBe(200);
    expect(res.body.farm).toMatchObject({ allocationMl: 1250, carryoverMl: 80, waterYearStartMonth: 7 });
  });

  it("refuses agronomists, workers and viewers (403) and strangers (404), changing nothing", async () => {
    for (const as of [team.agronomist, team.worker, team.viewer]) {
      const res = await patch({ name: "Taken over" }, as);
      expect(res.status).toBe(403);
      expect(res.body.error!.code).toBe("forbidden");
    }
    expect((await patch({ name: "Taken over" }, team.outsider)).status).toBe(404);
    expect((await db("farms").where({ id: team.farmId }).first("name")).name).not.toBe("Taken over");
  });

  it("refuses another farm's settings through this farm's id only (404 for its own id)", async () => {
    const res = await call<Body>(farmRoute.PATCH, `/api/v1/farms/${otherFarmId}`, { method: "PATCH", as: team.owner, params: { farmId: otherFarmId }, body: { name: "Mine" } });
    expect(res.status).toBe(404);
  });
});
