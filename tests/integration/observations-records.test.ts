/**
 * Time-stamped rain records (tips, logger intervals) against a real database: batches, duplicates by
 * gauge and instant, the 10 000-record limit, and the account day the dirty mark starts from.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { queue } from "@/lib/jobs/queue";
import * as records from "@/app/api/v1/farms/[farmId]/rain-records/route";
import { call, type ApiJson } from "../helpers/api";
import { createFarmTeam, type FarmTeam, type TestUser } from "../helpers/fixtures";

let team: FarmTeam;
let other: FarmTeam;
let gaugeId: string;
let otherGaugeId: string;
let fieldIds: string[];

beforeAll(async () => {
  team = await createFarmTeam();
  other = await createFarmTeam();
  [{ id: gaugeId }] = await db("gauges").insert({ farm_id: team.farmId, name: "Tipping bucket", kind: "recording" }).returning("id");
  [{ id: otherGaugeId }] = await db("gauges").insert({ farm_id: other.farmId, name: "Their bucket", kind: "recording" }).returning("id");
  const rows = await db("fields")
    .insert([
      { farm_id: team.farmId, name: "North", area_ha: 10 },
      { farm_id: team.farmId, name: "South", area_ha: 5 },
    ])
    .returning("id");
  fieldIds = rows.map((r: { id: string }) => r.id);
});

beforeEach(async () => {
  await db("fields").whereIn("id", fieldIds).update({ account_dirty_from: null });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

async function dirtyFrom(): Promise<(string | null)[]> {
  const rows = await db("fields").whereIn("id", fieldIds).orderBy("name").select("account_dirty_from");
  return rows.map((r: { account_dirty_from: string | null }) => r.account_dirty_from);
}

describe("rain records", () => {
  const recordsUrl = () => `/api/v1/farms/${team.farmId}/rain-records`;
  const postRecords = (body: unknown, as: TestUser = team.worker) =>
    call<{ inserted: number; duplicates: number } & ApiJson>(records.POST, recordsUrl(), { method: "POST", as, params: { farmId: team.farmId }, body });

  it("stores a batch of tips, counting repeats of the same gauge and instant as duplicates", async () => {
    const tips = [
      { at: "2026-11-28T14:00:00Z", depthMm: 0.2 },
      { at: "2026-11-28T14:03:00Z", depthMm: 0.2 },
      { at: "2026-11-28T14:05:00Z", depthMm: 0.2 },
    ];
    const first = await postRecords({ gaugeId, records: tips });
    expect(first.body).toEqual({ inserted: 3, duplicates: 0 });
    // the same instant written in another zone is the same record
    const again = await postRecords({ gaugeId, records: [...tips, { at: "2026-11-29T01:05:00+11:00", depthMm: 0.2 }, { at: "2026-11-28T14:09:00Z", depthMm: 0.2 }] });
    expect(again.body).toEqual({ inserted: 1, duplicates: 4 });
    // 14:00 UTC is 01:00 on the 29th in Sydney, before the 09:00 boundary: the account day of the 28th
    expect(await dirtyFrom()).toEqual(["2026-11-28", "2026-11-28"]);
  });

  it("takes 10 000 records in one request and refuses more", async () => {
    const start = Date.parse("2026-06-01T00:00:00Z");
    const many = Array.from({ length: 10_000 }, (_, i) => ({ at: new Date(start + i * 60_000).toISOString(), depthMm: 0.2, intervalS: 60 }));
    expect((await postRecords({ gaugeId, records: many })).body).toEqual({ inserted: 10_000, duplicates: 0 });
    const tooMany = await postRecords({ gaugeId, records: [...many, { at: "2026-07-01T00:00:00Z", depthMm: 0.2 }] });
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.error?.fields).toHaveProperty("records");
  });

  it("names a bad record, refuses viewers (403) and other farms' gauges (404)", async () => {
    const bad = await postRecords({ gaugeId, records: [{ at: "2026-11-28T15:00:00Z", depthMm: 0.2 }, { at: "2026-11-28T15:01:00Z", depthMm: 0 }] });
    expect(bad.status).toBe(422);
    expect(bad.body.error?.fields).toHaveProperty("records.1.depthMm");
    expect((await postRecords({ gaugeId, records: [{ at: "2026-11-28T15:00:00Z", depthMm: 0.2 }] }, team.viewer)).status).toBe(403);
    expect((await postRecords({ gaugeId: otherGaugeId, records: [{ at: "2026-11-28T15:00:00Z", depthMm: 0.2 }] })).status).toBe(404);
  });

  it("lists records in time order between two instants", async () => {
    const res = await call<{ data: { at: string; depthMm: number }[]; page: { total: number } }>(
      records.GET,
      `${recordsUrl()}?gaugeId=${gaugeId}&from=2026-11-28T14:00:00Z&to=2026-11-28T14:06:00Z`,
      { as: team.viewer, params: { farmId: team.farmId } },
    );
    expect(res.status).toBe(200);
    expect(res.body.data.map((r) => r.at)).toEqual(["2026-11-28T14:00:00.000Z", "2026-11-28T14:03:00.000Z", "2026-11-28T14:05:00.000Z"]);
    expect(res.body.page.total).toBe(3);
  });
});
