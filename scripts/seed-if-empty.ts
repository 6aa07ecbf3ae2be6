/** Loads the demo farm into an empty database; a database that already has farms is left alone. */
import knexFactory from "knex";
import config from "../knexfile";

async function main(): Promise<void> {
  const knex = knexFactory(config);
  try {
    const row = await knex("farms").count<{ count: string }[]>({ count: "*" }).first();
    if (Number(row?.count ?? 0) > 0) return;
    console.log("rootbank: loading the demo farm");
    await knex.seed.run();
  } finally {
    await knex.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
