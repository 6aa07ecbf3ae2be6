import { spawn, type ChildProcess } from "node:child_process";
import { createInterface } from "node:readline";

/** Child processes started by this run; all are stopped together on Ctrl-C or at the end. */
const children: { name: string; child: ChildProcess }[] = [];

export function startProcess(name: string, cmd: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const child = spawn(cmd, args, { env, stdio: ["ignore", "pipe", "pipe"], detached: true });
  const label = `[${name}]`.padEnd(10);
  for (const stream of [child.stdout, child.stderr]) {
    if (!stream) continue;
    createInterface({ input: stream }).on("line", (line) => console.log(`${label} ${line}`));
  }
  child.on("exit", (code, signal) => {
    if (!stopping) console.log(`${label} exited (${signal ?? code})`);
  });
  children.push({ name, child });
  return child;
}

let stopping = false;

export async function stopAll(): Promise<void> {
  stopping = true;
  const waits = children.map(
    ({ child }) =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null || !child.pid) return resolve();
        const timer = setTimeout(() => {
          try {
            process.kill(-child.pid!, "SIGKILL");
          } catch {}
          resolve();
        }, 5000);
        child.once("exit", () => {
          clearTimeout(timer);
          resolve();
        });
        try {
          process.kill(-child.pid, "SIGTERM");
        } catch {
          resolve();
        }
      }),
  );
  await Promise.all(waits);
  children.length = 0;
  stopping = false;
}

/** Polls a URL until it answers (any HTTP status) or the time runs out. */
export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      await fetch(url, { redirect: "manual" });
      return;
    } catch {
      if (Date.now() > deadline) throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
      await new Promise((r) => setTimeout(r, 250));
    }
  }
}
