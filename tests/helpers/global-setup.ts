import { execFileSync } from "node:child_process";

/**
 * Brings the test database to the latest schema once before the integration tests run. The migrations
 * are TypeScript, so they run through the knex CLI under tsx, as `npm run db:migrate` does.
 */
export default function setup(): void {
  if (!process.env.DATABASE_URL) {
    throw new Error("Integration tests need DATABASE_URL; run them through `npm test`.");
  }
  execFileSync(
    process.execPath,
    ["--import", "tsx", "node_modules/knex/bin/cli.js", "--knexfile", "knexfile.ts", "migrate:latest"],
    { stdio: "inherit", env: process.env },
  );
}
