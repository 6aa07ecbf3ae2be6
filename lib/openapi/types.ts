import type { z } from "zod";
import type { Capability } from "@/lib/auth/roles";

/** One API operation, described from the same zod schemas the handler validates with. */
export interface Operation {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** OpenAPI path template, e.g. /api/v1/farms/{farmId}/fields */
  path: string;
  summary: string;
  tag: string;
  /** who may call it: anyone, any signed-in person, or a farm capability; 'logger' also takes API tokens */
  access: "public" | "user" | Capability | `${Capability}+logger`;
  body?: z.ZodType;
  /** content type of the body, when not JSON (e.g. multipart/form-data, text/csv) */
  bodyContentType?: string;
  /** further content types the same operation accepts, each with its own schema (e.g. a form with a file) */
  otherBodies?: Record<string, z.ZodType>;
  query?: z.ZodType;
  response?: z.ZodType;
  /** success status (default 200) */
  status?: number;
}
