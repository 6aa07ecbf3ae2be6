import { z } from "zod";

/** Query strings of the account API, shared by the handlers and the OpenAPI document. */

const isoDate = z.iso.date();

export const accountQuerySchema = z
  .object({ from: isoDate.optional(), to: isoDate.optional() })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "from must not be after to", path: ["from"] });

export const outlookQuerySchema = z.object({
  days: z.coerce.number().int().min(1).max(60).default(7),
  /** share of forecast rain counted (0: none, the cautious default; 1: all of it, after runoff) */
  forecastRain: z.coerce.number().min(0).max(1).default(0),
});

/** Longest span one account request returns, days. */
export const MAX_ACCOUNT_SPAN_DAYS = 400;

export function searchParams(req: Request): Record<string, string> {
  return Object.fromEntries(new URL(req.url).searchParams);
}
