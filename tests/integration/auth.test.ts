import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { authOptions, SIGN_IN_LIMITS, TOO_MANY_ATTEMPTS } from "@/lib/auth/options";
import * as invitations from "@/app/api/v1/farms/[farmId]/invitations/route";
import * as accept from "@/app/api/v1/invitations/accept/route";
import * as member from "@/app/api/v1/farms/[farmId]/members/[userId]/route";
import * as resets from "@/app/api/v1/password-resets/route";
import * as confirm from "@/app/api/v1/password-resets/confirm/route";
import * as missing from "@/app/api/[...missing]/route";
import { call } from "../helpers/api";
import { createFarmTeam, createUser, TEST_PASSWORD, type FarmTeam } from "../helpers/fixtures";
import { linkIn, mailsTo, waitForMail } from "../helpers/inbox";

type Authorize = (creds: Record<string, string>, req: { headers: Record<string, string> }) => Promise<{ id: string } | null>;
const authorize = (authOptions.providers[0] as unknown as { options: { authorize: Authorize } }).options.authorize;

let team: FarmTeam;

beforeAll(async () => {
  team = await createFarmTeam();
});

afterAll(async () => {
  await db.destroy();
});

/** A fresh documentation-range address, so counts from earlier runs in the same window do not carry over. */
const someAddress = () => ({ headers: { "x-forwarded-for": `2001:db8::${Math.floor(Math.random() * 0xffffffff).toString(16)}` } });

describe("sign-in", () => {
  const req = someAddress();

  it("accepts the right password and refuses a wrong one or an unknown account", async () => {
    expect(await authorize({ email: team.worker.email, password: TEST_PASSWORD }, req)).toMatchObject({ id: team.worker.id });
    expect(await authorize({ email: team.worker.email.toUpperCase(), password: TEST_PASSWORD }, req)).toMatchObject({ id: team.worker.id });
    expect(await authorize({ email: team.worker.email, password: "not the password" }, req)).toBeNull();
    expect(await authorize({ email: "nobody@test.rootbank.example", password: TEST_PASSWORD }, req)).toBeNull();
  });

  it("limits attempts per account, even with the right password after the limit", async () => {
    const user = await createUser("limited");
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      expect(await authorize({ email: user.email, password: "wrong guess" }, req)).toBeNull();
    }
    await expect(authorize({ email: user.email, password: TEST_PASSWORD }, req)).rejects.toThrow(TOO_MANY_ATTEMPTS);
  });

  it("counts only failed attempts: a person who signs in often is never locked out", async () => {
    const user = await createUser("often");
    const address = someAddress();
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount + 5; i++) {
      expect(await authorize({ email: user.email, password: TEST_PASSWORD }, address)).toMatchObject({ id: user.id });
    }
    for (let i = 0; i < SIGN_IN_LIMITS.perAccount; i++) {
      expect(await authorize({ email: user.email, password: "wrong guess" }, address)).toBeNull();
    }
    await expect(authorize({ email: user.email, password: TEST_PASSWORD }, address)).rejects.toThrow(TOO_MANY_ATTEMPTS);
  });

  it("limits attempts per network address across accounts", async () => {
    const address = someAddress();
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress; i++) {
      await authorize({ email: `guess${i}@test.rootbank.example`, password: "x" }, address);
    }
    await expect(authorize({ email: team.viewer.email, password: TEST_PASSWORD }, address)).rejects.toThrow(TOO_MANY_ATTEMPTS);
  });
});

describe("invitations", () => {
  it("an owner invites by e-mail; the link sets name and password and gives the role", async () => {
    const email = `new-adviser-${Date.now()}@test.rootbank.example`;
    const res = await call(invitations.POST, `/api/v1/farms/${team.farmId}/invitations`, {
      method: "POST",
      as: team.owner,
      params: { farmId: team.farmId },
      body: { email, role: "agronomist" },
    });
    expect(res.status).toBe(201);
    const mail = await waitForMail(email, /invited you/);
    const token = linkIn(mail, "/invite/").split("/invite/")[1]!;

    const accepted = await call(accept.POST, "/api/v1/invitations/accept", {
      method: "POST",
      body: { token, name: "Nadia Adviser", password: "a long new password" },
    });
    expect(accepted.status).toBe(200);
    const user = await db("users").where({ email }).first();
    expect(user.name).toBe("Nadia Adviser");
    expect(await db("memberships").where({ user_id: user.id, farm_id: team.farmId }).first("role")).toEqual({ role: "agronomist" });
    expect(await authorize({ email, password: "a long new password" }, { headers: {} })).toMatchObject({ id: user.id });

    const again = await call(accept.POST, "/api/v1/invitations/accept", {
      method: "POST",
      body: { token, name: "Someone else", password: "another long password" },
    });
    expect(again.status).toBe(410);
  });

  it("a manager may invite workers but not agronomists", async () => {
    const path = `/api/v1/farms/${team.farmId}/invitations`;
    const opts = { method: "POST", as: team.manager, params: { farmId: team.farmId } };
    const worker = await call(invitations.POST, path, { ...opts, body: { email: `hand-${Date.now()}@test.rootbank.example`, role: "worker" } });
    expect(worker.status).toBe(201);
    const adviser = await call(invitations.POST, path, { ...opts, body: { email: `adv-${Date.now()}@test.rootbank.example`, role: "agronomist" } });
    expect(adviser.status).toBe(403);
  });

  it("bad input is a 422 naming the field, and broken JSON a 400", async () => {
    const opts = { method: "POST", as: team.owner, params: { farmId: team.farmId } };
    const bad = await call(invitations.POST, `/api/v1/farms/${team.farmId}/invitations`, { ...opts, body: { email: "not-an-email", role: "boss" } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error?.fields ?? {}).sort()).toEqual(["email", "role"]);
    const broken = await call(invitations.POST, `/api/v1/farms/${team.farmId}/invitations`, { ...opts, rawBody: "{email:" });
    expect(broken.status).toBe(400);
    expect(broken.body.error?.code).toBe("bad_request");
  });
});

describe("members", () => {
  it("a manager cannot change an agronomist's role; an owner can", async () => {
    const path = `/api/v1/farms/${team.farmId}/members/${team.agronomist.id}`;
    const params = { farmId: team.farmId, userId: team.agronomist.id };
    const byManager = await call(member.PATCH, path, { method: "PATCH", as: team.manager, params, body: { role: "viewer" } });
    expect(byManager.status).toBe(403);
    const byOwner = await call(member.PATCH, path, { method: "PATCH", as: team.owner, params, body: { role: "viewer" } });
    expect(byOwner.status).toBe(200);
    await call(member.PATCH, path, { method: "PATCH", as: team.owner, params, body: { role: "agronomist" } });
  });

  it("the last owner cannot step down", async () => {
    const res = await call(member.PATCH, `/api/v1/farms/${team.farmId}/members/${team.owner.id}`, {
      method: "PATCH",
      as: team.owner,
      params: { farmId: team.farmId, userId: team.owner.id },
      body: { role: "manager" },
    });
    expect(res.status).toBe(409);
  });
});

describe("password reset", () => {
  it("e-mails a one-time link that sets a new password", async () => {
    const user = await createUser("forgetful");
    const requested = await call(resets.POST, "/api/v1/password-resets", { method: "POST", body: { email: user.email } });
    expect(requested.status).toBe(202);
    const token = linkIn(await waitForMail(user.email, /Reset your Rootbank password/), "/reset/").split("/reset/")[1]!;

    const done = await call(confirm.POST, "/api/v1/password-resets/confirm", { method: "POST", body: { token, password: "brand new password" } });
    expect(done.status).toBe(204);
    expect(await authorize({ email: user.email, password: "brand new password" }, { headers: {} })).toMatchObject({ id: user.id });
    expect(await authorize({ email: user.email, password: TEST_PASSWORD }, { headers: {} })).toBeNull();

    const reused = await call(confirm.POST, "/api/v1/password-resets/confirm", { method: "POST", body: { token, password: "yet another password" } });
    expect(reused.status).toBe(410);
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const email = `nobody-${Date.now()}@test.rootbank.example`;
    const res = await call(resets.POST, "/api/v1/password-resets", { method: "POST", body: { email } });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailsTo(email)).toEqual([]);
  });
});

describe("unknown API paths", () => {
  it("answer JSON 404 in the one error shape", async () => {
    const res = await call(missing.GET, "/api/v2/nothing");
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: "not_found", message: "No API at /api/v2/nothing." });
  });
});
