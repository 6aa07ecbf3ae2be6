import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError, handleApiError } from "@/lib/api/errors";
import { can, CAPABILITIES, ROLES } from "@/lib/auth/roles";

describe("one error model", () => {
  it("maps zod errors to 422 with the fields that are wrong", async () => {
    const result = z.object({ depthMm: z.number().min(0) }).safeParse({ depthMm: -3 });
    const res = handleApiError(result.error);
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { code: string; fields: Record<string, string> } };
    expect(body.error.code).toBe("invalid");
    expect(Object.keys(body.error.fields)).toEqual(["depthMm"]);
  });

  it("maps PostgreSQL unique and check violations to 409 and 422", () => {
    expect(handleApiError(Object.assign(new Error("dup"), { code: "23505" })).status).toBe(409);
    expect(handleApiError(Object.assign(new Error("check"), { code: "23514" })).status).toBe(422);
  });

  it("hides the details of unexpected errors", async () => {
    const res = handleApiError(new Error("password=hunter2 in connection string"));
    expect(res.status).toBe(500);
    const text = await res.text();
    expect(text).not.toContain("hunter2");
    expect(JSON.parse(text)).toEqual({ error: { code: "internal", message: expect.any(String) } });
  });

  it("keeps the code and status of an AppError", () => {
    expect(handleApiError(new AppError("forbidden", "no")).status).toBe(403);
    expect(handleApiError(new AppError("unauthenticated", "no")).status).toBe(401);
  });
});

describe("role matrix", () => {
  it("matches the table in the design: who can log, edit setup, edit agronomy, read the statement", () => {
    const table = Object.fromEntries(ROLES.map((r) => [r, Object.keys(CAPABILITIES).filter((c) => can(r, c as keyof typeof CAPABILITIES))]));
    expect(table).toEqual({
      owner: ["view", "log", "editSetup", "editAgronomy", "readStatement", "editAllocation", "manageMembers"],
      manager: ["view", "log", "editSetup", "editAgronomy", "readStatement", "editAllocation", "manageMembers"],
      agronomist: ["view", "log", "editAgronomy", "readStatement"],
      worker: ["view", "log"],
      viewer: ["view", "readStatement"],
    });
  });
});
