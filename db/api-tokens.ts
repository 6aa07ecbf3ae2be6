import "server-only";
import type { Knex } from "knex";
import { db } from "./knex";

/** A logger's API token as the app sees it; the hash never leaves this module. */
export interface ApiToken {
  id: string;
  farmId: string;
  name: string;
  prefix: string;
  gaugeIds: string[];
  stationIds: string[];
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

interface ApiTokenRow {
  id: string;
  farm_id: string;
  name: string;
  token_hash: string;
  token_prefix: string;
  gauge_ids: string[];
  station_ids: string[];
  created_at: Date;
  last_used_at: Date | null;
  revoked_at: Date | null;
}

const iso = (d: Date | null): string | null => (d ? new Date(d).toISOString() : null);

function toApiToken(r: ApiTokenRow): ApiToken {
  return {
    id: r.id,
    farmId: r.farm_id,
    name: r.name,
    prefix: r.token_prefix,
    gaugeIds: r.gauge_ids,
    stationIds: r.station_ids,
    createdAt: new Date(r.created_at).toISOString(),
    lastUsedAt: iso(r.last_used_at),
    revokedAt: iso(r.revoked_at),
  };
}

export async function insertApiToken(
  trx: Knex.Transaction,
  input: { farmId: string; name: string; hash: string; prefix: string; gaugeIds: string[]; stationIds: string[]; createdBy: string | null },
): Promise<ApiToken> {
  const [row] = (await trx("api_tokens")
    .insert({
      farm_id: input.farmId,
      name: input.name,
      token_hash: input.hash,
      token_prefix: input.prefix,
      gauge_ids: input.gaugeIds,
      station_ids: input.stationIds,
      created_by: input.createdBy,
    })
    .returning("*")) as ApiTokenRow[];
  return toApiToken(row!);
}

/** The farm's tokens, live ones first. */
export async function listApiTokens(farmId: string): Promise<ApiToken[]> {
  const rows = (await db("api_tokens")
    .where({ farm_id: farmId })
    .orderByRaw("revoked_at is not null, created_at desc")) as ApiTokenRow[];
  return rows.map(toApiToken);
}

export async function findLiveTokenByHash(hash: string): Promise<ApiToken | undefined> {
  const row = (await db("api_tokens").where({ token_hash: hash }).whereNull("revoked_at").first()) as ApiTokenRow | undefined;
  return row ? toApiToken(row) : undefined;
}

/** Stamps last use, at most once a minute so a busy logger does not write a row per request. */
export async function touchApiToken(id: string): Promise<void> {
  await db("api_tokens")
    .where({ id })
    .where((q) => q.whereNull("last_used_at").orWhere("last_used_at", "<", db.raw("now() - interval '1 minute'")))
    .update({ last_used_at: db.fn.now() });
}

export async function revokeApiTokenRow(trx: Knex.Transaction, farmId: string, id: string, by: string | null): Promise<ApiToken | undefined> {
  const [row] = (await trx("api_tokens")
    .where({ farm_id: farmId, id })
    .whereNull("revoked_at")
    .update({ revoked_at: trx.fn.now(), revoked_by: by })
    .returning("*")) as ApiTokenRow[];
  return row ? toApiToken(row) : undefined;
}

/** Those of `ids` that are gauges (or stations) of the farm, not archived. */
export async function idsOnFarm(table: "gauges" | "weather_stations", farmId: string, ids: readonly string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = (await db(table).where({ farm_id: farmId }).whereNull("archived_at").whereIn("id", ids).select("id")) as { id: string }[];
  return new Set(rows.map((r) => r.id));
}
