import { execFileSync, spawnSync, type SpawnSyncOptions } from "node:child_process";

export const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

/** Runs a command and returns its exit status; output goes to our console unless `quiet`. */
export function run(cmd: string, args: string[], opts: SpawnSyncOptions & { quiet?: boolean } = {}): number {
  const result = spawnSync(cmd, args, { stdio: opts.quiet ? "pipe" : "inherit", ...opts });
  if (result.error) throw result.error;
  return result.status ?? 1;
}

/** Runs a command and returns its standard output, throwing with its error output on failure. */
export function capture(cmd: string, args: string[], opts: { env?: NodeJS.ProcessEnv } = {}): string {
  return execFileSync(cmd, args, { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"], env: opts.env }).trim();
}

export function commandExists(cmd: string): boolean {
  return spawnSync("sh", ["-c", `command -v ${cmd}`], { stdio: "ignore" }).status === 0;
}

/** Runs as root directly, otherwise through sudo (needed for apt-get). */
export function asAdmin(cmd: string, args: string[]): number {
  return isRoot ? run(cmd, args) : run("sudo", [cmd, ...args]);
}
