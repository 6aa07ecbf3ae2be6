import "server-only";
import "./pg-types";
import knexFactory, { type Knex } from "knex";
import { env } from "@/lib/env";

const globalForDb = globalThis as unknown as { rootbankKnex?: Knex };

/** The one Knex instance. Cached on globalThis so dev reloads reuse the pool. */
export const db: Knex =
  globalForDb.rootbankKnex ??
  knexFactory({
    client: "pg",
    connection: env().DATABASE_URL,
    pool: { min: 0, max: Number(process.env.DB_POOL_MAX ?? 10) },
  });

globalForDb.rootbankKnex = db;
