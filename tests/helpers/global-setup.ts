import knexFactory from "knex";
import config from "../../knexfile";

/** Brings the test database to the latest schema once before the integration tests run. */
export default async function setup(): Promise<void> {
  if (!process.env.DATABASE_URL) {
    throw new Error("Integration tests need DATABASE_URL; run them through `npm test`.");
  }
  const knex = knexFactory(config);
  try {
    await knex.migrate.latest();
  } finally {
    await knex.destroy();
  }
}
