/**
 * Every route handler under app/api is listed in ./access/*.ts with who may call it, and every role is
 * tried against it. A new route that is missing from the tables fails the first test.
 */
import { readdirSync } from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { can, ROLES } from "@/lib/auth/roles";
import type { AccessTable } from "./access/types";
import { call } from "../helpers/api";
import { createFarmTeam, createUser, type FarmTeam, type TestUser } from "../helpers/fixtures";

/** The tables in ./access/, one module per area of the API, merged. */
async function loadAccessTable(): Promise<AccessTable> {
  const dir = path.join(__dirname, "access");
  const tables = await Promise.all(
    readdirSync(dir)
      .filter((f) => f.endsWith(".ts") && f !== "types.ts")
      .map(async (f) => ((await import(path.join(dir, f))) as { access: AccessTable }).access),
  );
  return Object.assign({}, ...tables) as AccessTable;
}

const ACCESS = await loadAccessTable();

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
const API_DIR = path.resolve(__dirname, "../../app/api");

interface Route {
  key: string;
  method: (typeof METHODS)[number];
  pattern: string;
  file: string;
}

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? routeFiles(path.join(dir, e.name)) : e.name === "route.ts" ? [path.join(dir, e.name)] : [],
  );
}

async function discoverRoutes(): Promise<Route[]> {
  const routes: Route[] = [];
  for (const file of routeFiles(API_DIR)) {
    const pattern = "/api" + path.dirname(path.relative(API_DIR, file)).replace(/^\.$/, "").replace(/^/, "/").replace(/\/$/, "");
    const mod = (await import(file)) as Record<string, unknown>;
    for (const method of METHODS) {
      if (typeof mod[method] === "function") routes.push({ key: `${method} ${pattern}`, method, pattern, file });
    }
  }
  return routes;
}

let team: FarmTeam;
let subject: TestUser;
let routes: Route[];

beforeAll(async () => {
  team = await createFarmTeam();
  subject = await createUser("subject");
  routes = await discoverRoutes();
});

afterAll(async () => {
  await db.destroy();
});

/** Fills a route pattern's segments with ids from the test farm. */
function concrete(pattern: string): { url: string; params: Record<string, string> } {
  const values: Record<string, string> = {
    farmId: team.farmId,
    userId: subject.id,
    invitationId: randomUUID(),
    "...missing": "no/such/thing",
  };
  const params: Record<string, string> = {};
  const url = pattern.replace(/\[([^\]]+)\]/g, (_m, name: string) => {
    const value = values[name] ?? "x";
    params[name.replace(/^\.\.\./, "")] = value;
    return value;
  });
  return { url, params };
}

async function callRoute(route: Route, as: TestUser | null) {
  // The subject is a worker before every call, so removing or changing them is always possible to try.
  await db("memberships")
    .insert({ user_id: subject.id, farm_id: team.farmId, role: "worker" })
    .onConflict(["user_id", "farm_id"])
    .merge({ role: "worker" });
  const mod = (await import(route.file)) as Record<string, unknown>;
  const { url, params } = concrete(route.pattern);
  // A body every role with the capability may send (managers may appoint workers only).
  const body = route.method === "GET" || route.method === "DELETE" ? undefined : { role: "worker" };
  return call(mod[route.method], url, { method: route.method, as, params, body });
}

describe("route access table", () => {
  it("lists every route handler under app/api", () => {
    const missing = routes.map((r) => r.key).filter((k) => !(k in ACCESS));
    expect(missing, "add these routes to a table in tests/integration/access/").toEqual([]);
  });

  it("has no entry for a route that no longer exists", () => {
    const existing = new Set(routes.map((r) => r.key));
    expect(Object.keys(ACCESS).filter((k) => !existing.has(k))).toEqual([]);
  });
});

describe.each(Object.entries(ACCESS).filter(([key]) => !key.includes("[...nextauth]")))("%s", (key, access) => {
  const route = () => routes.find((r) => r.key === key)!;

  if (access === "public") {
    it("answers without a session, never with 401 or 403", async () => {
      const res = await callRoute(route(), null);
      expect([401, 403]).not.toContain(res.status);
    });
    return;
  }

  it("needs a session (401 without one)", async () => {
    const res = await callRoute(route(), null);
    expect(res.status).toBe(401);
    expect(res.body.error?.code).toBe("unauthenticated");
  });

  if (access === "user") return;

  it("shows nothing to a member of another farm (404)", async () => {
    const res = await callRoute(route(), team.outsider);
    expect(res.status).toBe(404);
  });

  it.each(ROLES)("as %s: allowed only where the role matrix says so", async (role) => {
    const res = await callRoute(route(), team[role]);
    if (can(role, access)) {
      expect([401, 403]).not.toContain(res.status);
    } else {
      expect(res.status).toBe(403);
      expect(res.body.error?.code).toBe("forbidden");
    }
  });
});
