/**
 * Logger tokens against a real database: made once and stored as a hash, scoped to gauges and stations of
 * one farm, refused everywhere else (403), revocable (401 after), rate-limited per token (429).
 */
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { queue } from "@/lib/jobs/queue";
import { hashToken } from "@/lib/auth/tokens";
import { TOKEN_RATE_LIMIT } from "@/lib/api/logger-handler";
import * as tokens from "@/app/api/v1/farms/[farmId]/api-tokens/route";
import * as tokenRoute from "@/app/api/v1/farms/[farmId]/api-tokens/[tokenId]/route";
import * as records from "@/app/api/v1/farms/[farmId]/rain-records/route";
import * as weather from "@/app/api/v1/farms/[farmId]/weather-days/route";
import * as readings from "@/app/api/v1/farms/[farmId]/rain-readings/route";
import * as events from "@/app/api/v1/farms/[farmId]/irrigation-events/route";
import { BASE, call, type ApiJson } from "../helpers/api";
import { createFarmTeam, type FarmTeam, type TestUser } from "../helpers/fixtures";

interface TokenInfo {
  id: string;
  name: string;
  prefix: string;
  gaugeIds: string[];
  stationIds: string[];
  lastUsedAt: string | null;
  revokedAt: string | null;
}
type Made = ApiJson & { token: string; apiToken: TokenInfo };

let team: FarmTeam;
let other: FarmTeam;
let gaugeA: string;
let gaugeB: string;
let station: string;
let otherGauge: string;

async function insertOne(table: string, row: Record<string, unknown>): Promise<string> {
  const [r] = await db(table).insert(row).returning("id");
  return r.id;
}

beforeAll(async () => {
  team = await createFarmTeam();
  other = await createFarmTeam();
  gaugeA = await insertOne("gauges", { farm_id: team.farmId, name: "Tipping bucket A", kind: "recording" });
  gaugeB = await insertOne("gauges", { farm_id: team.farmId, name: "Tipping bucket B", kind: "recording" });
  station = await insertOne("weather_stations", { farm_id: team.farmId, name: "Station" });
  otherGauge = await insertOne("gauges", { farm_id: other.farmId, name: "Theirs", kind: "recording" });
  await insertOne("fields", { farm_id: team.farmId, name: "Only field", area_ha: 12 });
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

const base = (farmId = team.farmId) => `/api/v1/farms/${farmId}`;
const make = (body: unknown, as: TestUser = team.owner, farmId = team.farmId) =>
  call<Made>(tokens.POST, `${base(farmId)}/api-tokens`, { method: "POST", as, params: { farmId }, body });
const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
const postRecords = (token: string, gaugeId: string, farmId = team.farmId, at = "2026-11-28T14:00:00Z") =>
  call<ApiJson & { inserted: number }>(records.POST, `${base(farmId)}/rain-records`, {
    method: "POST",
    params: { farmId },
    headers: bearer(token),
    body: { gaugeId, records: [{ at, depthMm: 0.2 }] },
  });

describe("making and listing tokens", () => {
  it("shows a new token once, stores only its hash, and lists it without the secret", async () => {
    const res = await make({ name: "Bucket A logger", gaugeIds: [gaugeA] });
    expect(res.status).toBe(201);
    expect(res.body.token).toMatch(/^rbk_[A-Za-z0-9_-]{43}$/);
    expect(res.body.apiToken).toMatchObject({ name: "Bucket A logger", gaugeIds: [gaugeA], stationIds: [], lastUsedAt: null });
    const row = await db("api_tokens").where({ id: res.body.apiToken.id }).first();
    expect(row.token_hash).toBe(hashToken(res.body.token));
    expect(JSON.stringify(row)).not.toContain(res.body.token);
    const listed = await call<{ data: TokenInfo[] }>(tokens.GET, `${base()}/api-tokens`, { as: team.manager, params: { farmId: team.farmId } });
    expect(listed.body.data.map((t) => t.name)).toContain("Bucket A logger");
    expect(JSON.stringify(listed.body)).not.toContain(res.body.token);
    expect(JSON.stringify(listed.body)).not.toContain(row.token_hash);
    expect(await db("audit_log").where({ entity: "api_token", entity_id: res.body.apiToken.id, action: "create" }).first()).toMatchObject({ user_id: team.owner.id });
  });

  it("needs a scope on this farm, and the manageMembers capability", async () => {
    const none = await make({ name: "Nothing" });
    expect(none.status).toBe(422);
    expect(none.body.error?.fields).toHaveProperty("gaugeIds");
    const foreign = await make({ name: "Theirs", gaugeIds: [otherGauge] });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error?.fields).toHaveProperty("gaugeIds.0");
    expect((await make({ name: "Mine", gaugeIds: [gaugeA] }, team.agronomist)).status).toBe(403);
    expect((await make({ name: "Mine", gaugeIds: [gaugeA] }, team.outsider)).status).toBe(404);
  });
});

describe("posting with a token", () => {
  let token: string;
  let tokenId: string;

  beforeAll(async () => {
    const res = await make({ name: "Field logger", gaugeIds: [gaugeA], stationIds: [station] });
    token = res.body.token;
    tokenId = res.body.apiToken.id;
  });

  it("posts rain records for its gauge, attributed to the token, and records its last use", async () => {
    const res = await postRecords(token, gaugeA);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ inserted: 1, duplicates: 0 });
    const entry = await db("audit_log").where({ entity: "rain_records", entity_id: gaugeA }).orderBy("id", "desc").first();
    expect(entry).toMatchObject({ actor: "token:Field logger", user_id: null, farm_id: team.farmId });
    expect((await db("api_tokens").where({ id: tokenId }).first()).last_used_at).not.toBeNull();
    expect(await db("fields").where({ farm_id: team.farmId }).pluck("account_dirty_from")).toEqual(["2026-11-28"]);
  });

  it("posts weather days for its station", async () => {
    const res = await call(weather.POST, `${base()}/weather-days`, {
      method: "POST",
      params: { farmId: team.farmId },
      headers: bearer(token),
      body: { stationId: station, source: "station logger", days: [{ date: "2026-11-28", tmaxC: 30, tminC: 15 }] },
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ inserted: 1, updated: 0 });
  });

  it("is refused (403) outside its scope: another gauge, another farm, any other route", async () => {
    const wrongGauge = await postRecords(token, gaugeB);
    expect(wrongGauge.status).toBe(403);
    expect(await postRecords(token, otherGauge, other.farmId).then((r) => r.status)).toBe(403);
    const params = { farmId: team.farmId };
    const attempts = [
      call(records.GET, `${base()}/rain-records`, { params, headers: bearer(token) }),
      call(readings.POST, `${base()}/rain-readings`, { method: "POST", params, headers: bearer(token), body: { gaugeId: gaugeA, readAt: "2026-11-30T09:00:00+11:00", depthMm: 1 } }),
      call(events.GET, `${base()}/irrigation-events`, { params, headers: bearer(token) }),
      call(tokens.GET, `${base()}/api-tokens`, { params, headers: bearer(token) }),
    ];
    for (const res of await Promise.all(attempts)) expect(res.status).toBe(403);
  });

  it("answers 401 for an unknown token or a malformed header", async () => {
    expect((await postRecords("rbk_not-a-real-token-at-all-000000000000000000", gaugeA)).status).toBe(401);
    const malformed = await call(records.POST, `${base()}/rain-records`, { method: "POST", params: { farmId: team.farmId }, headers: { authorization: "Token abc" }, body: {} });
    expect(malformed.status).toBe(401);
  });

  it(`limits each token to ${TOKEN_RATE_LIMIT.limit} requests a minute (429 with Retry-After)`, async () => {
    const limited = await make({ name: "Chatty logger", gaugeIds: [gaugeA] });
    // Fill this window and the next (so a minute turning over mid-test changes nothing) instead of sending 600 requests.
    await db.raw(
      `insert into rate_limits (key, window_start, count)
       select ?, to_timestamp(floor(extract(epoch from now()) / ?) * ? + s * ?), ?
       from generate_series(0, 1) s`,
      [`api-token:${limited.body.apiToken.id}`, TOKEN_RATE_LIMIT.windowS, TOKEN_RATE_LIMIT.windowS, TOKEN_RATE_LIMIT.windowS, TOKEN_RATE_LIMIT.limit],
    );
    const req = new NextRequest(`${BASE}${base()}/rain-records`, {
      method: "POST",
      headers: { ...bearer(limited.body.token), "content-type": "application/json" },
      body: JSON.stringify({ gaugeId: gaugeA, records: [{ at: "2026-11-28T15:00:00Z", depthMm: 0.2 }] }),
    });
    const res = await records.POST(req, { params: Promise.resolve({ farmId: team.farmId }) });
    expect(res.status).toBe(429);
    expect(((await res.json()) as ApiJson).error?.code).toBe("rate_limited");
    const retryAfterS = Number(res.headers.get("retry-after"));
    expect(retryAfterS).toBeGreaterThanOrEqual(1);
    expect(retryAfterS).toBeLessThanOrEqual(TOKEN_RATE_LIMIT.windowS);
    // the other token of the farm is not held back
    expect((await postRecords(token, gaugeA, team.farmId, "2026-11-28T15:30:00Z")).status).toBe(200);
  });

  it("stops working once revoked (401), and revoking twice is 404", async () => {
    const params = { farmId: team.farmId, tokenId };
    const worker = await call(tokenRoute.DELETE, `${base()}/api-tokens/${tokenId}`, { method: "DELETE", as: team.worker, params });
    expect(worker.status).toBe(403);
    const revoked = await call(tokenRoute.DELETE, `${base()}/api-tokens/${tokenId}`, { method: "DELETE", as: team.manager, params });
    expect(revoked.status).toBe(204);
    expect((await postRecords(token, gaugeA, team.farmId, "2026-11-28T16:00:00Z")).status).toBe(401);
    expect((await call(tokenRoute.DELETE, `${base()}/api-tokens/${tokenId}`, { method: "DELETE", as: team.owner, params })).status).toBe(404);
    const fromOtherFarm = await call(tokenRoute.DELETE, `${base(other.farmId)}/api-tokens/${tokenId}`, {
      method: "DELETE",
      as: other.owner,
      params: { farmId: other.farmId, tokenId },
    });
    expect(fromOtherFarm.status).toBe(404);
    expect(await db("audit_log").where({ entity: "api_token", entity_id: tokenId, action: "revoke" }).first()).toMatchObject({ user_id: team.manager.id });
  });
});
