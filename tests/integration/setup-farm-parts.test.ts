/**
 * PATCH /api/v1/farms/:farmId checks each part of the body against its own capability. Today's role matrix
 * gives editSetup and editAllocation to the same roles, so this file narrows editAllocation to owners to
 * show that a manager's allocation change is refused while their other settings still go through.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Capability, Role } from "@/lib/auth/roles";
import * as farmRoute from "@/app/api/v1/farms/[farmId]/route";
import { db } from "@/db/knex";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";

vi.mock("@/lib/auth/roles", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/lib/auth/roles")>();
  const CAPABILITIES: Record<Capability, readonly Role[]> = { ...real.CAPABILITIES, editAllocation: ["owner"] };
  return { ...real, CAPABILITIES, can: (role: Role | null | undefined, c: Capability) => role != null && CAPABILITIES[c].includes(role) };
});

let team: FarmTeam;

interface Body {
  farm?: Record<string, unknown>;
  error?: { code: string; fields?: Record<string, string> };
}

const patch = (body: Record<string, unknown>, as = team.manager) =>
  call<Body>(farmRoute.PATCH, `/api/v1/farms/${team.farmId}`, { method: "PATCH", as, params: { farmId: team.farmId }, body });

beforeAll(async () => {
  team = await createFarmTeam();
});

afterAll(async () => {
  const other = await db("memberships").where({ user_id: team.outsider.id }).first("farm_id");
  await db("farms").whereIn("id", [team.farmId, other.farm_id]).delete();
  await db.destroy();
});

describe("a role that may change some parts of the farm but not others", () => {
  it("refuses the parts it may not change with 403 naming them, and changes nothing", async () => {
    const res = await patch({ name: "Manager's name", allocationMl: 999 });
    expect(res.status).toBe(403);
    expect(res.body.error!.fields).toEqual({ allocationMl: "Your role may not change this" });
    const farm = await db("farms").where({ id: team.farmId }).first("name", "allocation_ml");
    expect(farm.allocation_ml).toBeNull();
    expect(farm.name).not.toBe("Manager's name");
  });

  it("still lets it change the parts it may", async () => {
    expect((await patch({ name: "Manager's name" })).status).toBe(200);
    expect((await patch({ allocationMl: 999 }, team.owner)).status).toBe(200);
  });
});
