/**
 * Rain readings (with photos) against a real database: the reading-day rule, one reading
 * per gauge and day, idempotent client ids, corrections in the audit log, and the dirty marks a write leaves.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { queue } from "@/lib/jobs/queue";
import { localDiskStore } from "@/lib/storage/local-disk";
import * as readings from "@/app/api/v1/farms/[farmId]/rain-readings/route";
import * as reading from "@/app/api/v1/farms/[farmId]/rain-readings/[readingId]/route";
import * as photo from "@/app/api/v1/farms/[farmId]/rain-readings/[readingId]/photo/route";
import { BASE, call, sessionCookie, type ApiJson } from "../helpers/api";
import { createFarmTeam, type FarmTeam, type TestUser } from "../helpers/fixtures";

interface Reading {
  id: string;
  gaugeId: string;
  readAt: string;
  rainDate: string;
  depthMm: number;
  trace: boolean;
  hasPhoto: boolean;
  note: string | null;
}
type ReadingBody = ApiJson & { reading: Reading };

let team: FarmTeam;
let other: FarmTeam;
let gaugeId: string;
let otherGaugeId: string;
let fieldIds: string[];
const uploadDir = mkdtempSync(path.join(tmpdir(), "rootbank-uploads-"));

async function gauge(farmId: string, name: string): Promise<string> {
  const [row] = await db("gauges").insert({ farm_id: farmId, name, kind: "manual" }).returning("id");
  return row.id;
}

beforeAll(async () => {
  (globalThis as unknown as { rootbankFileStore: unknown }).rootbankFileStore = localDiskStore(uploadDir);
  team = await createFarmTeam();
  other = await createFarmTeam();
  gaugeId = await gauge(team.farmId, "House gauge");
  otherGaugeId = await gauge(other.farmId, "Their gauge");
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
  rmSync(uploadDir, { recursive: true, force: true });
});

const url = (farmId = team.farmId) => `/api/v1/farms/${farmId}/rain-readings`;
const post = (body: unknown, as: TestUser = team.worker, farmId = team.farmId) =>
  call<ReadingBody>(readings.POST, url(farmId), { method: "POST", as, params: { farmId }, body });

async function dirtyFrom(): Promise<(string | null)[]> {
  const rows = await db("fields").whereIn("id", fieldIds).orderBy("name").select("account_dirty_from");
  return rows.map((r: { account_dirty_from: string | null }) => r.account_dirty_from);
}

async function recomputeQueued(farmId: string): Promise<boolean> {
  const row = await db("jobs.job").where({ name: "recompute", singleton_key: farmId }).first("id");
  return row !== undefined;
}

describe("rain readings", () => {
  it("books a 09:00 reading to the day before (reading-day rule: common practice, no source)", async () => {
    // Sydney is on daylight time (+11:00) in late November; the farm's boundary hour is the default 9.
    const res = await post({ gaugeId, readAt: "2026-11-30T09:00:00+11:00", depthMm: 12.4 });
    expect(res.status).toBe(201);
    expect(res.body.reading).toMatchObject({ gaugeId, rainDate: "2026-11-29", depthMm: 12.4, trace: false, hasPhoto: false });
    // an 08:40 reading is the same morning's read (the nearest boundary), still the day before
    const early = await post({ gaugeId, readAt: "2026-11-26T08:40:00+11:00", depthMm: 3 });
    expect(early.body.reading.rainDate).toBe("2026-11-25");
  });

  it("marks every field of the farm dirty from the rain day and asks for a recompute", async () => {
    const res = await post({ gaugeId, readAt: "2026-11-20T09:05:00+11:00", trace: true });
    expect(res.status).toBe(201);
    expect(res.body.reading).toMatchObject({ rainDate: "2026-11-19", depthMm: 0, trace: true });
    expect(await dirtyFrom()).toEqual(["2026-11-19", "2026-11-19"]);
    expect(await recomputeQueued(team.farmId)).toBe(true);
  });

  it("keeps an explicit rain date", async () => {
    const res = await post({ gaugeId, readAt: "2026-11-10T17:00:00+11:00", rainDate: "2026-11-10", depthMm: 4 });
    expect(res.body.reading.rainDate).toBe("2026-11-10");
  });

  it("refuses a second reading for the same gauge and day with a plain 409", async () => {
    const res = await post({ gaugeId, readAt: "2026-11-30T10:30:00+11:00", depthMm: 1 });
    expect(res.status).toBe(409);
    expect(res.body.error?.message).toMatch(/House gauge already has a reading for 2026-11-29/);
    expect(res.body.error?.fields).toHaveProperty("rainDate");
  });

  it("returns the stored row (200) when the same client id is sent again", async () => {
    const id = randomUUID();
    const body = { id, gaugeId, readAt: "2026-11-05T09:00:00+11:00", depthMm: 7.5 };
    const first = await post(body);
    expect(first.status).toBe(201);
    const again = await post(body);
    expect(again.status).toBe(200);
    expect(again.body.reading).toEqual(first.body.reading);
    expect(await db("rain_readings").where({ id }).count("* as n").first()).toMatchObject({ n: 1 });
    expect(await db("audit_log").where({ entity: "rain_reading", entity_id: id }).count("* as n").first()).toMatchObject({ n: 1 });
  });

  it("names the field that is wrong", async () => {
    const missing = await post({ gaugeId, readAt: "2026-11-01T09:00:00+11:00" });
    expect(missing.status).toBe(422);
    expect(missing.body.error?.fields).toHaveProperty("depthMm");
    const negative = await post({ gaugeId, readAt: "2026-11-01T09:00:00+11:00", depthMm: -2 });
    expect(negative.body.error?.fields).toHaveProperty("depthMm");
    const noZone = await post({ gaugeId, readAt: "2026-11-01 09:00", depthMm: 2 });
    expect(noZone.status).toBe(422);
    expect(noZone.body.error?.fields).toHaveProperty("readAt");
  });

  it("does not let a viewer log (403) and shows another farm nothing (404)", async () => {
    expect((await post({ gaugeId, readAt: "2026-10-01T09:00:00+10:00", depthMm: 1 }, team.viewer)).status).toBe(403);
    expect((await post({ gaugeId, readAt: "2026-10-01T09:00:00+10:00", depthMm: 1 }, team.outsider)).status).toBe(404);
    // a member who guesses a gauge of another farm
    const guessed = await post({ gaugeId: otherGaugeId, readAt: "2026-10-01T09:00:00+10:00", depthMm: 1 });
    expect(guessed.status).toBe(404);
    expect(guessed.body.error?.fields).toHaveProperty("gaugeId");
  });

  it("lists by date range and gauge, newest first, paginated", async () => {
    const res = await call<{ data: Reading[]; page: { total: number; nextOffset: number | null } }>(
      readings.GET,
      `${url()}?from=2026-11-01&to=2026-11-30&gaugeId=${gaugeId}&limit=2`,
      { as: team.viewer, params: { farmId: team.farmId } },
    );
    expect(res.status).toBe(200);
    expect(res.body.data.map((r) => r.rainDate)).toEqual(["2026-11-29", "2026-11-25"]);
    expect(res.body.page.total).toBe(5); // the 29th, 25th, 19th, 10th and 4th
    expect(res.body.page.nextOffset).toBe(2);
    const bad = await call(readings.GET, `${url()}?from=yesterday`, { as: team.viewer, params: { farmId: team.farmId } });
    expect(bad.status).toBe(422);
    expect(bad.body.error?.fields).toHaveProperty("from");
    const theirs = await call<{ data: Reading[] }>(readings.GET, url(), { as: other.owner, params: { farmId: other.farmId } });
    expect(theirs.body.data).toEqual([]);
  });

  it("corrects a reading with a reason in the audit log, and marks from the earlier day", async () => {
    const { body } = await post({ gaugeId, readAt: "2026-11-15T09:00:00+11:00", depthMm: 25 });
    const id = body.reading.id;
    const params = { farmId: team.farmId, readingId: id };
    const noReason = await call(reading.PATCH, `${url()}/${id}`, { method: "PATCH", as: team.worker, params, body: { depthMm: 2.5 } });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error?.fields).toHaveProperty("reason");
    await db("fields").whereIn("id", fieldIds).update({ account_dirty_from: null });
    const res = await call<ReadingBody>(reading.PATCH, `${url()}/${id}`, {
      method: "PATCH",
      as: team.agronomist,
      params,
      body: { depthMm: 2.5, readAt: "2026-11-16T09:00:00+11:00", reason: "decimal point missed" },
    });
    expect(res.status).toBe(200);
    expect(res.body.reading).toMatchObject({ depthMm: 2.5, rainDate: "2026-11-15" });
    expect(await dirtyFrom()).toEqual(["2026-11-14", "2026-11-14"]);
    const entry = await db("audit_log").where({ entity: "rain_reading", entity_id: id, action: "update" }).first();
    expect(entry).toMatchObject({ user_id: team.agronomist.id, actor: "user", reason: "decimal point missed" });
    expect(entry.before).toMatchObject({ depthMm: 25, rainDate: "2026-11-14" });
    expect(entry.after).toMatchObject({ depthMm: 2.5, rainDate: "2026-11-15" });
    // moving it onto a day the gauge already has is the same plain 409 as a second reading
    const clash = await call(reading.PATCH, `${url()}/${id}`, { method: "PATCH", as: team.worker, params, body: { rainDate: "2026-11-19", reason: "wrong day" } });
    expect(clash.status).toBe(409);
    expect(clash.body.error?.message).toMatch(/already has a reading for 2026-11-19/);
  });

  it("answers 404 for another farm's reading, a guessed id and a malformed id", async () => {
    const theirs = await post({ gaugeId: otherGaugeId, readAt: "2026-11-30T09:00:00+11:00", depthMm: 3 }, other.worker, other.farmId);
    expect(theirs.status).toBe(201);
    for (const id of [theirs.body.reading.id, randomUUID(), "not-an-id"]) {
      const params = { farmId: team.farmId, readingId: id };
      expect((await call(reading.GET, `${url()}/${id}`, { as: team.owner, params })).status).toBe(404);
      expect((await call(reading.PATCH, `${url()}/${id}`, { method: "PATCH", as: team.owner, params, body: { depthMm: 1, reason: "x" } })).status).toBe(404);
      expect((await call(reading.DELETE, `${url()}/${id}`, { method: "DELETE", as: team.owner, params })).status).toBe(404);
    }
    expect(await db("rain_readings").where({ id: theirs.body.reading.id }).first("depth_mm")).toEqual({ depth_mm: 3 });
  });

  it("deletes a reading, audited with its reason, and marks from its day", async () => {
    const { body } = await post({ gaugeId, readAt: "2026-11-03T09:00:00+11:00", depthMm: 9 });
    const id = body.reading.id;
    await db("fields").whereIn("id", fieldIds).update({ account_dirty_from: null });
    const res = await call(reading.DELETE, `${url()}/${id}?reason=wrong%20gauge`, { method: "DELETE", as: team.worker, params: { farmId: team.farmId, readingId: id } });
    expect(res.status).toBe(204);
    expect(await db("rain_readings").where({ id }).first()).toBeUndefined();
    expect(await dirtyFrom()).toEqual(["2026-11-02", "2026-11-02"]);
    expect(await db("audit_log").where({ entity: "rain_reading", entity_id: id, action: "delete" }).first()).toMatchObject({ reason: "wrong gauge" });
  });
});

async function postForm(form: FormData, as: TestUser = team.worker): Promise<{ status: number; body: ReadingBody }> {
  const req = new NextRequest(`${BASE}${url()}`, { method: "POST", body: form, headers: { cookie: await sessionCookie(as) } });
  const res = await readings.POST(req, { params: Promise.resolve({ farmId: team.farmId }) });
  return { status: res.status, body: (await res.json()) as ReadingBody };
}

// The first bytes of a JPEG (SOI marker and a JFIF APP0 segment), then filler.
const JPEG_HEAD = [0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00];
function jpeg(size: number): File {
  const bytes = new Uint8Array(size);
  bytes.set(JPEG_HEAD);
  return new File([bytes], "gauge.jpg", { type: "image/jpeg" });
}

function form(fields: Record<string, string>, file?: File): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  if (file) f.set("photo", file);
  return f;
}

describe("reading photos", () => {
  it("stores a photo sent with a reading and serves it to members who can view", async () => {
    const res = await postForm(form({ gaugeId, readAt: "2026-10-20T09:00:00+11:00", depthMm: "6.2", note: "bucket half full" }, jpeg(2048)));
    expect(res.status).toBe(201);
    expect(res.body.reading).toMatchObject({ rainDate: "2026-10-19", depthMm: 6.2, hasPhoto: true, note: "bucket half full" });
    const params = { farmId: team.farmId, readingId: res.body.reading.id };
    const req = new NextRequest(`${BASE}${url()}/${params.readingId}/photo`, { headers: { cookie: await sessionCookie(team.viewer) } });
    const served = await photo.GET(req, { params: Promise.resolve(params) });
    expect(served.status).toBe(200);
    expect(served.headers.get("content-type")).toBe("image/jpeg");
    const bytes = new Uint8Array(await served.arrayBuffer());
    expect(bytes.length).toBe(2048);
    expect([...bytes.subarray(0, JPEG_HEAD.length)]).toEqual(JPEG_HEAD);
    expect((await call(photo.GET, `${url()}/${params.readingId}/photo`, { as: other.owner, params })).status).toBe(404);
    // removing the reading removes its photo from the store
    const key = `farms/${team.farmId}/rain-readings/${params.readingId}.jpg`;
    expect(await localDiskStore(uploadDir).get(key)).toBeDefined();
    expect((await call(reading.DELETE, `${url()}/${params.readingId}`, { method: "DELETE", as: team.worker, params })).status).toBe(204);
    expect(await localDiskStore(uploadDir).get(key)).toBeUndefined();
  });

  it("refuses a photo over 10 MB with 413 and a clear message, storing nothing", async () => {
    const before = await db("rain_readings").count("* as n").first();
    const res = await postForm(form({ gaugeId, readAt: "2026-10-21T09:00:00+11:00", depthMm: "1" }, jpeg(10 * 1024 * 1024 + 1)));
    expect(res.status).toBe(413);
    expect(res.body.error?.message).toMatch(/larger than 10 MB/);
    expect(res.body.error?.fields).toHaveProperty("photo");
    expect(await db("rain_readings").count("* as n").first()).toEqual(before);
  });

  it("refuses an upload announced as over 10 MB before reading it (413)", async () => {
    const body = form({ gaugeId, readAt: "2026-10-21T09:00:00+11:00", depthMm: "1" }, jpeg(1024));
    const framed = new Request("http://x", { method: "POST", body });
    const req = new NextRequest(`${BASE}${url()}`, {
      method: "POST",
      body: await framed.arrayBuffer(),
      headers: { cookie: await sessionCookie(team.worker), "content-type": framed.headers.get("content-type") ?? "", "content-length": String(11 * 1024 * 1024) },
    });
    const res = await readings.POST(req, { params: Promise.resolve({ farmId: team.farmId }) });
    expect(res.status).toBe(413);
  });

  it("refuses a file that is not a photo, whatever type it claims", async () => {
    const fake = new File([new TextEncoder().encode("<html>not an image</html>")], "gauge.jpg", { type: "image/jpeg" });
    const res = await postForm(form({ gaugeId, readAt: "2026-10-22T09:00:00+11:00", depthMm: "1" }, fake));
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("photo");
  });

  it("names a bad form field, and says 404 for a reading without a photo", async () => {
    const res = await postForm(form({ gaugeId, readAt: "2026-10-23T09:00:00+11:00", depthMm: "lots" }));
    expect(res.status).toBe(422);
    expect(res.body.error?.fields).toHaveProperty("depthMm");
    const plain = await post({ gaugeId, readAt: "2026-10-24T09:00:00+11:00", depthMm: 1 });
    const params = { farmId: team.farmId, readingId: plain.body.reading.id };
    const none = await call(photo.GET, `${url()}/${params.readingId}/photo`, { as: team.viewer, params });
    expect(none.status).toBe(404);
  });
});
