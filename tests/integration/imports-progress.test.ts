/**
 * A large file is processed after the answer, by a worker: the upload waits in the file store with its
 * queued job (so it outlives the request), the import row's status and progress move as the worker goes,
 * and the same file sent meanwhile is recognised instead of being imported twice.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/knex";
import * as importsRoute from "@/app/api/v1/farms/[farmId]/imports/route";
import * as importRoute from "@/app/api/v1/farms/[farmId]/imports/[importId]/route";
import { importFileKey, type ImportJobData } from "@/lib/imports/background";
import { SYNC_IMPORT_BYTES } from "@/lib/imports/run";
import { runImportJob } from "@/lib/jobs/imports";
import { JOBS, queue } from "@/lib/jobs/queue";
import { fileStore } from "@/lib/storage";
import { call } from "../helpers/api";
import { createFarmTeam, type FarmTeam } from "../helpers/fixtures";
import { upload } from "../fixtures/imports/upload";

interface ImportBody {
  id: string;
  status: string;
  progress: number;
  repeat: boolean;
  counts: { inserted: number };
  report: { warnings: string[] } | null;
}

let team: FarmTeam;
let stationId: string;

/** Two years of hourly rows (invented, for size): every hour of 2024 and 2025, stamps ending each hour. */
function twoYearsHourly(): string {
  const lines = ["time,temp,rh,wind,solar,rain"];
  const start = Date.UTC(2024, 0, 1, 1);
  const end = Date.UTC(2026, 0, 1, 0);
  for (let t = start; t <= end; t += 3_600_000) {
    const d = new Date(t);
    const hour = d.getUTCHours();
    const stamp = d.toISOString().slice(0, 16).replace("T", " ");
    const temp = 15 + 8 * Math.sin(((hour - 9) / 24) * 2 * Math.PI);
    const solar = hour >= 7 && hour <= 18 ? 600 * Math.sin(((hour - 6) / 13) * Math.PI) : 0;
    lines.push(
      `${stamp},${temp.toFixed(1)},${(70 - (temp - 15) * 3).toFixed(0)},${(2 + (hour % 5) * 0.3).toFixed(1)},${solar.toFixed(0)},0`,
    );
  }
  return lines.join("\n") + "\n";
}

beforeAll(async () => {
  team = await createFarmTeam();
  // UTC keeps every local day 24 hours long, so the count of whole days is plain: 366 + 365.
  await db("farms").where({ id: team.farmId }).update({ time_zone: "Etc/UTC" });
  const [row] = await db("weather_stations")
    .insert({ farm_id: team.farmId, name: "Logger station", latitude: -34.4, longitude: 146.0 })
    .returning("id");
  stationId = row.id;
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
});

describe("large imports", () => {
  it("answers 202 at once and shows real progress until done", async () => {
    const csv = twoYearsHourly();
    expect(csv.length).toBeGreaterThan(SYNC_IMPORT_BYTES);
    const options = {
      stationId,
      interval: "hourly",
      columns: { date: "time", temp: "temp", rh: "rh", wind: "wind", solar: "solar", rain: "rain" },
      units: { solar: "W/m2" },
    };
    const res = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "two-years.csv", data: csv },
      "weather_csv",
      options,
    );
    expect(res.status).toBe(202);
    expect(res.body).toMatchObject({ status: "processing", progress: 0 });

    const again = await upload<ImportBody>(
      importsRoute.POST,
      team.farmId,
      team.worker,
      { name: "two-years.csv", data: csv },
      "weather_csv",
      options,
    );
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ id: res.body.id, repeat: true });

    // no worker yet: the file waits in the store and its job in the queue
    const key = importFileKey(team.farmId, res.body.id);
    expect((await fileStore().get(key))?.data.byteLength).toBe(Buffer.byteLength(csv));
    const waiting = await db("jobs.job").where({ name: JOBS.importFile, singleton_key: res.body.id }).select("state");
    expect(waiting.map((j: { state: string }) => j.state)).toEqual(["created"]);

    // a worker starts (as `npm run worker` would) and takes the job
    const boss = await queue();
    await boss.work<ImportJobData>(JOBS.importFile, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
      if (job) await runImportJob(job.data);
    });
    const seen: number[] = [];
    let current: ImportBody = res.body;
    for (let i = 0; i < 2400 && current.status === "processing"; i++) {
      await new Promise((r) => setTimeout(r, 25));
      current = (
        await call<ImportBody>(importRoute.GET, "/x", {
          as: team.worker,
          params: { farmId: team.farmId, importId: res.body.id },
        })
      ).body;
      seen.push(current.progress);
    }
    console.log(`progress seen while polling: ${[...new Set(seen.map((p) => p.toFixed(2)))].join(" → ")}`);
    expect(current.status).toBe("done");
    expect(current.progress).toBe(1);
    expect(seen).toEqual([...seen].sort((a, b) => a - b)); // it only moves forward
    expect(seen.some((p) => p > 0 && p < 1)).toBe(true); // and is seen between start and end
    expect(current.counts.inserted).toBe(731);
    expect(current.report?.warnings).toEqual([]);
    expect(
      await db("weather_days").where({ station_id: stationId }).count<{ n: string }[]>({ n: "*" }),
    ).toEqual([{ n: 731 }]);
    // the worker removes the upload once the import is finished (just after the row says so)
    await vi.waitFor(async () => expect(await fileStore().get(key)).toBeUndefined(), { timeout: 10_000 });
  }, 90_000);
});
