import type { Knex } from "knex";
import "./db/pg-types";
import { loadEnvConfig } from "@next/env";

loadEnvConfig(process.cwd());

const connection = process.env.DATABASE_URL;
if (!connection) {
  throw new Error("DATABASE_URL is not set. Run `npm start` (it sets up a local database) or set it yourself.");
}

const config: Knex.Config = {
  client: "pg",
  connection,
  migrations: { directory: "./migrations", extension: "ts", loadExtensions: [".ts"] },
  seeds: { directory: "./seeds", extension: "ts", loadExtensions: [".ts"] },
};

export default config;
