/**
 * Rootbank's one set-up script: `npm start`, `npm run dev`, `npm test`, `npm run worker`, `npm run bench`.
 * It makes sure the database is there, writes generated secrets once, migrates, loads the demo farm into an
 * empty database, builds when sources changed, and runs the app with its local services and worker.
 */
import { existsSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { ensureCluster, ensureDatabases, recreateDatabase, stopCluster, type Cluster } from "./setup/postgres";
import { ensureSecrets } from "./setup/env-file";
import { say, fail } from "./setup/log";
import { run, asAdmin } from "./setup/shell";
import { RUN_PORTS, TEST_PORTS, type Ports } from "./setup/ports";
import { startProcess, stopAll, waitForHttp } from "./setup/processes";
import { ensureLocalCert, extraCaFile } from "./fakes/tls";

const NODE = process.execPath;
const TSX = ["--import", "tsx"];
const KNEX = [...TSX, "node_modules/knex/bin/cli.js", "--knexfile", "knexfile.ts"];
const SERVER_CODE = ["--conditions=react-server", ...TSX];

let cluster: Cluster | undefined;

interface Setup {
  env: NodeJS.ProcessEnv;
  urls: { main: string; test: string };
}

/** Secrets, database and the environment every child process gets. */
async function prepare(ports: Ports): Promise<Setup> {
  const secrets = ensureSecrets();
  const localCert = await ensureLocalCert();
  let urls: { main: string; test: string };
  const userUrl = process.env.DATABASE_URL;
  if (userUrl) {
    say("using the PostgreSQL server named by DATABASE_URL");
    urls = { main: userUrl, test: process.env.TEST_DATABASE_URL ?? userUrl.replace(/\/([^/?]+)(\?|$)/, "/$1_test$2") };
  } else {
    cluster = ensureCluster();
    const password = process.env.ROOTBANK_DB_PASSWORD ?? secrets.ROOTBANK_DB_PASSWORD ?? "";
    const made = ensureDatabases(cluster, password, ["rootbank", "rootbank_test"]);
    urls = { main: made.rootbank!, test: made.rootbank_test! };
  }
  const baseUrl = `http://localhost:${ports.app}`;
  const env: NodeJS.ProcessEnv = {
    ...secrets,
    ...process.env,
    NEXT_TELEMETRY_DISABLED: "1",
    NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? baseUrl,
    PORT: String(ports.app),
    SMTP_HOST: process.env.SMTP_HOST ?? "127.0.0.1",
    SMTP_PORT: process.env.SMTP_PORT ?? String(ports.smtp),
    LOCAL_INBOX_URL: process.env.SMTP_HOST ? process.env.LOCAL_INBOX_URL : `http://127.0.0.1:${ports.inboxHttp}`,
    LOCAL_INBOX_SMTP_PORT: String(ports.smtp),
    LOCAL_INBOX_HTTP_PORT: String(ports.inboxHttp),
    FORECAST_API_URL: process.env.FORECAST_API_URL ?? `http://127.0.0.1:${ports.forecast}`,
    FAKE_FORECAST_PORT: String(ports.forecast),
    FAKE_PUSH_PORT: String(ports.push),
    // The local fakes that speak HTTPS use this certificate; every Node process started here trusts it.
    NODE_EXTRA_CA_CERTS: extraCaFile(localCert, process.env.NODE_EXTRA_CA_CERTS),
  };
  return { env, urls };
}

function migrate(env: NodeJS.ProcessEnv): void {
  if (run(NODE, [...KNEX, "migrate:latest"], { env, quiet: true }) !== 0) {
    run(NODE, [...KNEX, "migrate:latest"], { env });
    fail("database migration failed");
  }
}

function seedIfEmpty(env: NodeJS.ProcessEnv): void {
  if (run(NODE, [...SERVER_CODE, "scripts/seed-if-empty.ts"], { env }) !== 0) fail("loading the demo farm failed");
}

const BUILD_INPUTS = ["app", "components", "lib", "db", "public", "next.config.mjs", "tailwind.config.ts", "package-lock.json", "postcss.config.mjs", "proxy.ts"];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

function buildIfStale(env: NodeJS.ProcessEnv, force = false): number {
  const stamp = ".next/BUILD_ID";
  const built = existsSync(stamp) ? statSync(stamp).mtimeMs : 0;
  const changed = Math.max(...BUILD_INPUTS.map(newestMtime));
  if (!force && built > changed) return 0;
  say("building the app (next build)…");
  return run(NODE, ["node_modules/next/dist/bin/next", "build"], { env: { ...env, NODE_ENV: "production" } });
}

function startServices(env: NodeJS.ProcessEnv): void {
  startProcess("services", NODE, [...TSX, "scripts/local-services.ts"], env);
  startProcess("worker", NODE, [...SERVER_CODE, "scripts/worker.ts"], env);
}

async function shutdown(code: number): Promise<never> {
  await stopAll();
  if (cluster?.startedHere) {
    say("stopping PostgreSQL");
    stopCluster(cluster);
  }
  process.exit(code);
}

function onInterrupt(): void {
  const handler = () => {
    console.log();
    say("stopping…");
    void shutdown(0);
  };
  process.on("SIGINT", handler);
  process.on("SIGTERM", handler);
}

function printSignIns(baseUrl: string): void {
  say(`Rootbank is running on ${baseUrl}`);
  say("demo sign-ins (password for all: rootbank-demo):");
  for (const [role, email] of [
    ["owner", "owner@kestrelbend.example"],
    ["manager", "manager@kestrelbend.example"],
    ["agronomist", "agronomist@kestrelbend.example"],
    ["worker", "worker@kestrelbend.example"],
    ["viewer", "viewer@kestrelbend.example"],
  ]) {
    say(`  ${role!.padEnd(11)} ${email}`);
  }
  say(`captured e-mail: ${baseUrl}/dev/inbox. Press Ctrl-C to stop.`);
}

async function startApp(dev: boolean): Promise<void> {
  onInterrupt();
  const { env, urls } = await prepare(RUN_PORTS);
  const appEnv = { ...env, DATABASE_URL: urls.main };
  say("migrating the database");
  migrate(appEnv);
  seedIfEmpty(appEnv);
  if (!dev && buildIfStale(appEnv) !== 0) return shutdown(1);
  startServices(appEnv);
  const next = ["node_modules/next/dist/bin/next", dev ? "dev" : "start", "-p", String(RUN_PORTS.app)];
  const server = startProcess("web", NODE, next, { ...appEnv, NODE_ENV: dev ? "development" : "production" });
  server.on("exit", () => void shutdown(1));
  const baseUrl = `http://localhost:${RUN_PORTS.app}`;
  await waitForHttp(`${baseUrl}/api/health`, 120_000);
  printSignIns(baseUrl);
}

async function startWorker(): Promise<void> {
  onInterrupt();
  const { env, urls } = await prepare(RUN_PORTS);
  const worker = startProcess("worker", NODE, [...SERVER_CODE, "scripts/worker.ts"], { ...env, DATABASE_URL: urls.main });
  worker.on("exit", (code) => void shutdown(code ?? 1));
}

function ensureChromium(): void {
  if (existsSync("/usr/bin/chromium")) return;
  say("installing Debian's Chromium for the browser tests…");
  if (asAdmin("apt-get", ["update", "-qq"]) !== 0 || asAdmin("apt-get", ["install", "-y", "-qq", "chromium"]) !== 0) {
    fail("could not install chromium (apt-get install chromium)");
  }
}

async function runTests(): Promise<void> {
  onInterrupt();
  const { env, urls } = await prepare(TEST_PORTS);
  const testEnv: NodeJS.ProcessEnv = { ...env, DATABASE_URL: urls.test, ROOTBANK_TEST: "1" };
  if (cluster) recreateDatabase(cluster, "rootbank_test");
  ensureChromium();
  const results: { step: string; ok: boolean }[] = [];
  const step = (name: string, status: number) => {
    results.push({ step: name, ok: status === 0 });
    say(`${name}: ${status === 0 ? "passed" : "FAILED"}`);
  };

  // `npm test -- browser` runs only the build and the browser tests, for quick rounds on screens; any
  // further arguments go to Playwright (`npm test -- browser tests/e2e/worker.spec.ts --project phone`).
  const browserOnly = process.argv[3] === "browser";
  const playwrightArgs = browserOnly ? process.argv.slice(4) : [];
  if (!browserOnly) {
    step("type-check", run(NODE, ["node_modules/typescript/bin/tsc", "--noEmit"], { env: testEnv }));
    step("lint", run(NODE, ["node_modules/eslint/bin/eslint.js", "."], { env: testEnv }));
  }

  startProcess("services", NODE, [...TSX, "scripts/local-services.ts"], testEnv);
  await waitForHttp(`http://127.0.0.1:${TEST_PORTS.inboxHttp}/messages`);
  if (!browserOnly) {
    step("unit and integration tests (vitest)", run(NODE, ["node_modules/vitest/vitest.mjs", "run"], { env: { ...testEnv, NODE_ENV: "test" } }));
  }

  step("production build", buildIfStale(testEnv, true));

  // The browser tests run against the demo farm in a fresh test database.
  if (cluster) recreateDatabase(cluster, "rootbank_test");
  migrate(testEnv);
  seedIfEmpty(testEnv);
  startProcess("worker", NODE, [...SERVER_CODE, "scripts/worker.ts"], testEnv);
  startProcess("web", NODE, ["node_modules/next/dist/bin/next", "start", "-p", String(TEST_PORTS.app)], {
    ...testEnv,
    NODE_ENV: "production",
  });
  await waitForHttp(`http://localhost:${TEST_PORTS.app}/api/health`, 120_000);
  step(
    "browser tests (Playwright, Chromium)",
    run(NODE, ["node_modules/@playwright/test/cli.js", "test", ...playwrightArgs], {
      env: { ...testEnv, E2E_BASE_URL: `http://localhost:${TEST_PORTS.app}` },
    }),
  );

  const failed = results.filter((r) => !r.ok);
  console.log();
  for (const r of results) say(`${r.ok ? "ok    " : "FAILED"} ${r.step}`);
  console.log(`steps: ${results.length - failed.length} passed, ${failed.length} failed`);
  await shutdown(failed.length === 0 ? 0 : 1);
}

async function runBench(): Promise<void> {
  onInterrupt();
  const { env, urls } = await prepare(TEST_PORTS);
  const benchEnv: NodeJS.ProcessEnv = { ...env, DATABASE_URL: urls.test, NODE_ENV: "production" };
  // The benches write to the test database's tables as the current migrations shape them.
  migrate(benchEnv);
  const files = existsSync("tests/bench") ? readdirSync("tests/bench").filter((f) => f.endsWith(".bench.ts")).sort() : [];
  let status = 0;
  for (const file of files) {
    say(`benchmark ${file}`);
    status ||= run(NODE, [...SERVER_CODE, path.join("tests/bench", file)], { env: benchEnv });
  }
  await shutdown(status);
}

const command = process.argv[2] ?? "start";
const commands: Record<string, () => Promise<void>> = {
  start: () => startApp(false),
  dev: () => startApp(true),
  test: runTests,
  worker: startWorker,
  bench: runBench,
};
const action = commands[command];
if (!action) fail(`unknown command ${command}; use one of ${Object.keys(commands).join(", ")}`);
action().catch(async (err: unknown) => {
  console.error(err);
  await shutdown(1);
});
