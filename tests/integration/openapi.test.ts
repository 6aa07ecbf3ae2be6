import { readdirSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as openapi from "@/app/api/v1/openapi.json/route";
import { OPERATIONS } from "@/lib/openapi/document";
import { call } from "../helpers/api";

const API_DIR = path.resolve(__dirname, "../../app/api");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"];

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? routeFiles(path.join(dir, e.name)) : e.name === "route.ts" ? [path.join(dir, e.name)] : [],
  );
}

describe("OpenAPI document", () => {
  it("describes every route handler of the API, and nothing else", async () => {
    const routes: string[] = [];
    for (const file of routeFiles(API_DIR)) {
      const dir = path.dirname(path.relative(API_DIR, file));
      if (dir.startsWith("auth") || dir.startsWith("[...missing]")) continue;
      const template = `/api/${dir}`.replace(/\[(\w+)\]/g, "{$1}");
      const mod = (await import(file)) as Record<string, unknown>;
      for (const m of METHODS) if (typeof mod[m] === "function") routes.push(`${m.toLowerCase()} ${template}`);
    }
    const described = OPERATIONS.map((op) => `${op.method} ${op.path}`);
    expect(described.filter((d) => !routes.includes(d)), "described but not implemented").toEqual([]);
    expect(routes.filter((r) => !described.includes(r)), "implemented but not described").toEqual([]);
  });

  it("is served as OpenAPI 3.1 with the error shape", async () => {
    const res = await call<{ openapi: string; paths: Record<string, unknown>; components: { schemas: Record<string, unknown> } }>(
      openapi.GET,
      "/api/v1/openapi.json",
    );
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe("3.1.0");
    expect(Object.keys(res.body.paths)).toContain("/api/v1/farms/{farmId}/invitations");
    expect(res.body.components.schemas).toHaveProperty("Error");
  });

  it("documents both bodies a gauge reading may come in: JSON, and a form with the photo as a file", async () => {
    type Body = { content: Record<string, { schema: { properties: Record<string, { format?: string }> } }> };
    const res = await call<{ paths: Record<string, { post?: { requestBody: Body } }> }>(openapi.GET, "/api/v1/openapi.json");
    const content = res.body.paths["/api/v1/farms/{farmId}/rain-readings"]?.post?.requestBody.content ?? {};
    expect(Object.keys(content).sort()).toEqual(["application/json", "multipart/form-data"]);
    expect(content["multipart/form-data"]?.schema.properties.photo?.format).toBe("binary");
    expect(content["application/json"]?.schema.properties).not.toHaveProperty("photo");
  });
});
