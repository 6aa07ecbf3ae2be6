import { z } from "zod";
import type { Operation } from "./types";
import { operations as people } from "./paths/people";
import { operations as setup } from "./paths/setup";
import { operations as observations } from "./paths/observations";
import { operations as accounts } from "./paths/accounts";
import { operations as imports } from "./paths/imports";
import { operations as alerts } from "./paths/alerts";
import { operations as statement } from "./paths/statement";
import { operations as agronomy } from "./paths/agronomy";

export const OPERATIONS: readonly Operation[] = [...people, ...setup, ...observations, ...accounts, ...imports, ...alerts, ...agronomy, ...statement];

const errorSchema = {
  type: "object",
  required: ["error"],
  properties: {
    error: {
      type: "object",
      required: ["code", "message"],
      properties: {
        code: { type: "string" },
        message: { type: "string" },
        fields: { type: "object", additionalProperties: { type: "string" } },
      },
    },
  },
};

function jsonSchema(schema: z.ZodType, io: "input" | "output"): Record<string, unknown> {
  return z.toJSONSchema(schema, { target: "draft-2020-12", io, unrepresentable: "any" }) as Record<string, unknown>;
}

function describeAccess(access: Operation["access"]): string {
  if (access === "public") return "Open to anyone.";
  if (access === "user") return "Any signed-in person.";
  const [capability, logger] = access.split("+");
  return `Members whose role has the \`${capability}\` capability${logger ? ", or a logger API token scoped to it" : ""}.`;
}

/** The OpenAPI 3.1 document of Rootbank's REST API, generated from the handlers' zod schemas. */
export function openApiDocument(serverUrl: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of OPERATIONS) {
    const params = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => ({
      name: m[1],
      in: "path",
      required: true,
      schema: { type: "string" },
    }));
    const query = op.query ? jsonSchema(op.query, "input") : undefined;
    const queryParams = query?.properties
      ? Object.entries(query.properties as Record<string, unknown>).map(([name, schema]) => ({ name, in: "query", required: false, schema }))
      : [];
    const status = String(op.status ?? 200);
    paths[op.path] ??= {};
    paths[op.path]![op.method] = {
      summary: op.summary,
      description: describeAccess(op.access),
      tags: [op.tag],
      parameters: [...params, ...queryParams],
      ...(op.body
        ? {
            requestBody: {
              required: true,
              content: {
                [op.bodyContentType ?? "application/json"]: { schema: jsonSchema(op.body, "input") },
                ...Object.fromEntries(Object.entries(op.otherBodies ?? {}).map(([type, schema]) => [type, { schema: jsonSchema(schema, "input") }])),
              },
            },
          }
        : {}),
      responses: {
        [status]: {
          description: "Success",
          ...(op.response ? { content: { "application/json": { schema: jsonSchema(op.response, "output") } } } : {}),
        },
        default: { description: "An error, in Rootbank's one error shape", content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } } },
      },
    };
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Rootbank API",
      version: "1",
      description:
        "Farms, fields, rain, weather, irrigation and the daily root-zone water account. Sign in with a session cookie, or send a logger token as `Authorization: Bearer …` where an operation allows it. Errors always have the shape `{ error: { code, message, fields? } }`.",
    },
    servers: [{ url: serverUrl }],
    paths,
    components: {
      schemas: { Error: errorSchema },
      securitySchemes: {
        session: { type: "apiKey", in: "cookie", name: "next-auth.session-token" },
        loggerToken: { type: "http", scheme: "bearer" },
      },
    },
  };
}
