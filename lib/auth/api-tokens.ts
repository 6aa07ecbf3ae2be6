import "server-only";
import { randomBytes } from "node:crypto";
import { audit } from "@/db/audit";
import { findLiveTokenByHash, idsOnFarm, insertApiToken, revokeApiTokenRow, type ApiToken } from "@/db/api-tokens";
import { db } from "@/db/knex";
import { AppError } from "@/lib/api/errors";
import type { ApiTokenInput } from "@/lib/validation/api-token";
import { hashToken } from "./tokens";

/** Who made a write, for attribution columns and the audit log: a person, or a logger's token. */
export interface Author {
  userId: string | null;
  /** 'user', or `token:<name>` for a logger */
  actor: string;
}

export const TOKEN_PREFIX = "rbk_";

/** A new token: 256 random bits behind a recognisable prefix (so secret scanners can spot leaks). */
export function newApiToken(): { token: string; hash: string; prefix: string } {
  const token = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token), prefix: token.slice(0, TOKEN_PREFIX.length + 6) };
}

/** Makes a token scoped to some of the farm's gauges and stations; the token is in the answer only. */
export async function issueApiToken(farmId: string, author: Author, input: ApiTokenInput): Promise<{ token: string; apiToken: ApiToken }> {
  const gauges = await idsOnFarm("gauges", farmId, input.gaugeIds);
  const stations = await idsOnFarm("weather_stations", farmId, input.stationIds);
  const missingGauge = input.gaugeIds.findIndex((id) => !gauges.has(id));
  const missingStation = input.stationIds.findIndex((id) => !stations.has(id));
  if (missingGauge >= 0) throw new AppError("not_found", "No such gauge on this farm.", { [`gaugeIds.${missingGauge}`]: "No such gauge on this farm" });
  if (missingStation >= 0) {
    throw new AppError("not_found", "No such weather station on this farm.", { [`stationIds.${missingStation}`]: "No such weather station on this farm" });
  }
  const { token, hash, prefix } = newApiToken();
  const apiToken = await db.transaction(async (trx) => {
    const row = await insertApiToken(trx, {
      farmId,
      name: input.name,
      hash,
      prefix,
      gaugeIds: [...new Set(input.gaugeIds)],
      stationIds: [...new Set(input.stationIds)],
      createdBy: author.userId,
    });
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "create", entity: "api_token", entityId: row.id, after: { name: row.name, gaugeIds: row.gaugeIds, stationIds: row.stationIds } }, trx);
    return row;
  });
  return { token, apiToken };
}

export async function revokeApiToken(farmId: string, author: Author, tokenId: string): Promise<void> {
  await db.transaction(async (trx) => {
    const row = await revokeApiTokenRow(trx, farmId, tokenId, author.userId);
    if (!row) throw new AppError("not_found", "No such token, or it is already revoked.");
    await audit({ farmId, userId: author.userId, actor: author.actor, action: "revoke", entity: "api_token", entityId: row.id, before: { name: row.name } }, trx);
  });
}

/** The token of an `Authorization: Bearer …` header; undefined when there is no such header. */
export function bearerOf(req: Request): string | undefined {
  const header = req.headers.get("authorization");
  if (!header) return undefined;
  const match = /^Bearer\s+(\S+)$/i.exec(header.trim());
  if (!match) throw new AppError("unauthenticated", "Send the token as `Authorization: Bearer rbk_…`.");
  return match[1];
}

/** The live token behind a bearer value, or a 401 that does not say whether it ever existed. */
export async function authenticateApiToken(bearer: string): Promise<ApiToken> {
  const token = bearer.startsWith(TOKEN_PREFIX) ? await findLiveTokenByHash(hashToken(bearer)) : undefined;
  if (!token) throw new AppError("unauthenticated", "This API token is not valid or has been revoked.");
  return token;
}

/** A token may only post for the gauges and stations it was made for. */
export function requireTokenScope(token: ApiToken | null, target: { gaugeId: string } | { stationId: string }): void {
  if (!token) return;
  const allowed = "gaugeId" in target ? token.gaugeIds.includes(target.gaugeId) : token.stationIds.includes(target.stationId);
  if (!allowed) {
    throw new AppError("forbidden", `This API token may not post for that ${"gaugeId" in target ? "gauge" : "weather station"}.`);
  }
}
