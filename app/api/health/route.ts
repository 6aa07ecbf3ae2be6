import { db } from "@/db/knex";

export const dynamic = "force-dynamic";

// GET /api/health — the app answers and its database is reachable
export async function GET(): Promise<Response> {
  try {
    await db.raw("select 1");
    return Response.json({ ok: true, database: "up" });
  } catch {
    return Response.json({ ok: false, database: "down" }, { status: 503 });
  }
}
