import { z } from "zod";

export const pageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export type PageQuery = z.infer<typeof pageQuerySchema>;

export interface Page<T> {
  data: T[];
  page: { limit: number; offset: number; total: number; nextOffset: number | null };
}

/** Reads `?limit=&offset=` from a request URL; bad values are a 422 naming the parameter. */
export function pageQuery(req: Request): PageQuery {
  const params = Object.fromEntries(new URL(req.url).searchParams);
  return pageQuerySchema.parse({ limit: params.limit, offset: params.offset });
}

export function toPage<T>(data: T[], query: PageQuery, total: number): Page<T> {
  const next = query.offset + data.length;
  return { data, page: { limit: query.limit, offset: query.offset, total, nextOffset: next < total ? next : null } };
}
