/**
 * The forecast: the local stand-in service is started on a free port and spoken to over real HTTP;
 * forecast days replace earlier forecast days and never touch observed ones.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startForecastFake } from "@/scripts/fakes/forecast";
import { HttpForecastProvider } from "@/lib/forecast/http";
import { clearSkySolarMJm2, dayOfYear, extraterrestrialRadiationMJm2, addDaysIso } from "@/lib/waterbalance";

// The app reads FORECAST_API_URL once, so the service must listen before any app module loads.
const fake = await startForecastFake({ port: 0 });
process.env.FORECAST_API_URL = fake.url;
const { db } = await import("@/db/knex");
const { queue } = await import("@/lib/jobs/queue");
const { farmToday } = await import("@/lib/farm-time");
const { refreshForecast } = await import("@/lib/forecast/refresh");
const refreshRoute = await import("@/app/api/v1/farms/[farmId]/forecast/refresh/route");
const forecastRoute = await import("@/app/api/v1/farms/[farmId]/forecast/route");
const { call } = await import("../helpers/api");
const { createFarmTeam } = await import("../helpers/fixtures");

type Team = Awaited<ReturnType<typeof createFarmTeam>>;
let team: Team;
let stationId: string;
let today: string;

beforeAll(async () => {
  team = await createFarmTeam();
  const [row] = await db("weather_stations")
    .insert({ farm_id: team.farmId, name: "Home", latitude: -34.4, longitude: 146.0 })
    .returning("id");
  stationId = row.id;
  today = farmToday("Australia/Sydney");
});

afterAll(async () => {
  await (await queue()).stop({ graceful: false });
  await db.destroy();
  await new Promise((resolve) => fake.server.close(resolve));
});

const forecastRows = () =>
  db("weather_days").where({ station_id: stationId, kind: "forecast" }).orderBy("date");

describe("the forecast service's API, through the HTTP provider", () => {
  const provider = new HttpForecastProvider(fake.url);

  it("answers the days asked for, the same each time for the same place and dates", async () => {
    const q = { latitude: -34.4, longitude: 146.0, days: 5, start: "2026-12-02" };
    const a = await provider.daily(q);
    expect(a.map((d) => d.date)).toEqual([
      "2026-12-02",
      "2026-12-03",
      "2026-12-04",
      "2026-12-05",
      "2026-12-06",
    ]);
    expect(await provider.daily(q)).toEqual(a);
    expect(await provider.daily({ ...q, latitude: -20 })).not.toEqual(a);
    // plausible: the day's maximum over its minimum, humidity in order, solar under the clear-sky
    // envelope of FAO-56 eq. 37 at that latitude and date
    for (const d of a) {
      expect(d.tmaxC!).toBeGreaterThanOrEqual(d.tminC!);
      expect(d.rhMaxPct!).toBeGreaterThanOrEqual(d.rhMinPct!);
      expect(d.solarMJm2!).toBeLessThanOrEqual(
        clearSkySolarMJm2(extraterrestrialRadiationMJm2(-34.4, dayOfYear(d.date)), 0) + 0.05,
      );
    }
  });

  it("refuses a bad query with 400, which the provider reports as unavailable", async () => {
    const res = await fetch(`${fake.url}/v1/forecast?latitude=95&longitude=0`);
    expect(res.status).toBe(400);
    await expect(
      provider.daily({ latitude: 95, longitude: 0, days: 3, start: "2026-12-02" }),
    ).rejects.toThrow(/answered 400/);
  });
});

describe("refreshing a farm's forecast", () => {
  it("stores the next 7 days as forecast rows for the farm's station", async () => {
    const res = await call<{ from: string; to: string; stations: { stationId: string; days: number }[] }>(
      refreshRoute.POST,
      "/x",
      {
        method: "POST",
        as: team.worker,
        params: { farmId: team.farmId },
      },
    );
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      from: today,
      to: addDaysIso(today, 6),
      stations: [{ stationId, days: 7 }],
    });
    const rows = await forecastRows();
    expect(rows.map((r) => r.date)).toEqual(Array.from({ length: 7 }, (_, i) => addDaysIso(today, i)));
    expect(rows.every((r) => r.source === "forecast-api" && r.tmax_c !== null)).toBe(true);
    expect(
      await db("audit_log").where({ farm_id: team.farmId, action: "forecast.refresh" }).first(),
    ).toMatchObject({ user_id: team.worker.id });
  });

  it("replaces earlier forecast rows, also those beyond the new horizon", async () => {
    await refreshForecast(team.farmId, { days: 10 });
    expect(await forecastRows()).toHaveLength(10);
    const before = (await forecastRows()).map((r) => r.id);
    await call(refreshRoute.POST, "/x", {
      method: "POST",
      as: team.manager,
      params: { farmId: team.farmId },
    });
    const after = await forecastRows();
    expect(after).toHaveLength(7);
    expect(after.some((r) => before.includes(r.id))).toBe(false);
  });

  it("never overwrites an observed day, and readers get the observed one", async () => {
    const tomorrow = addDaysIso(today, 1);
    const [observed] = await db("weather_days")
      .insert({
        station_id: stationId,
        date: tomorrow,
        kind: "observed",
        tmax_c: 12.5,
        tmin_c: 3.5,
        rain_mm: 42,
      })
      .returning("*");
    await refreshForecast(team.farmId);
    const kept = await db("weather_days").where({ id: observed.id }).first();
    expect(kept).toMatchObject({ kind: "observed", tmax_c: 12.5, tmin_c: 3.5, rain_mm: 42 });
    expect(kept.updated_at.getTime()).toBe(observed.updated_at.getTime());
    const res = await call<{ stations: { days: { date: string; kind: string; tmaxC: number }[] }[] }>(
      forecastRoute.GET,
      "/x?days=3",
      {
        as: team.viewer,
        params: { farmId: team.farmId },
      },
    );
    expect(res.status).toBe(200);
    expect(res.body.stations[0]?.days.map((d) => [d.date, d.kind])).toEqual([
      [today, "forecast"],
      [tomorrow, "observed"],
      [addDaysIso(today, 2), "forecast"],
    ]);
    expect(res.body.stations[0]?.days[1]?.tmaxC).toBe(12.5);
  });

  it("says the service is unavailable (503) when it does not answer", async () => {
    await expect(
      refreshForecast(team.farmId, { provider: new HttpForecastProvider("http://127.0.0.1:9", 2000) }),
    ).rejects.toMatchObject({ code: "unavailable" });
    expect(await forecastRows()).toHaveLength(7); // the last good forecast stays
  });

  it("lets viewers read but not refresh; other farms see nothing", async () => {
    expect(
      (
        await call(refreshRoute.POST, "/x", {
          method: "POST",
          as: team.viewer,
          params: { farmId: team.farmId },
        })
      ).status,
    ).toBe(403);
    expect(
      (await call(forecastRoute.GET, "/x", { as: team.outsider, params: { farmId: team.farmId } })).status,
    ).toBe(404);
    expect(
      (
        await call(refreshRoute.POST, "/x", {
          method: "POST",
          as: team.outsider,
          params: { farmId: team.farmId },
        })
      ).status,
    ).toBe(404);
  });
});
