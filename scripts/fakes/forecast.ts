/**
 * A local stand-in for the hosted forecast service, for development, the demo and tests. It speaks the
 * service's JSON API (lib/forecast/http.ts) and answers with synthetic weather that depends only on the
 * place and the date, so the same question always gets the same answer.
 */
import { createServer, type Server } from "node:http";
import { clearSkySolarMJm2, dayOfYear, extraterrestrialRadiationMJm2, addDaysIso } from "@/lib/waterbalance";
import type { ForecastResponse } from "@/lib/forecast/http";

/** FNV-1a, 32-bit: a stable seed from text. */
function hash(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h;
}

/** mulberry32: a small, well-mixed generator of numbers in [0, 1). */
function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const round1 = (v: number) => Math.round(v * 10) / 10;

/** One synthetic day at a place: seasonal temperatures, some cloud, now and then rain. */
export function syntheticDay(
  latitude: number,
  longitude: number,
  date: string,
): ForecastResponse["days"][number] {
  const rand = generator(hash(`${latitude.toFixed(3)},${longitude.toFixed(3)},${date}`));
  const doy = dayOfYear(date);
  // Warmest about 20 days after the solstice of the place's own summer.
  const peakDoy = latitude >= 0 ? 192 : 10;
  const season = Math.cos((2 * Math.PI * (doy - peakDoy)) / 365);
  const mean = 27 - 0.35 * Math.abs(latitude) + (4 + 0.15 * Math.abs(latitude)) * season + (rand() - 0.5) * 4;
  const wet = rand() < 0.25;
  const range = wet ? 5 + rand() * 5 : 10 + rand() * 8;
  const ra = extraterrestrialRadiationMJm2(latitude, doy);
  const cloud = wet ? 0.35 + rand() * 0.25 : 0.65 + rand() * 0.3;
  return {
    date,
    air_temp_max_c: round1(mean + range / 2),
    air_temp_min_c: round1(mean - range / 2),
    humidity_max_pct: Math.round(wet ? 92 + rand() * 8 : 65 + rand() * 25),
    humidity_min_pct: Math.round(wet ? 55 + rand() * 25 : 18 + rand() * 30),
    wind_2m_ms: round1(0.8 + rand() * 4.5),
    solar_mj_m2: round1(Math.min(cloud * ra, clearSkySolarMJm2(ra, 0))),
    rain_mm: wet ? round1(-Math.log(1 - rand()) * 7) : 0,
  };
}

export function forecastFor(
  latitude: number,
  longitude: number,
  start: string,
  days: number,
): ForecastResponse {
  return {
    latitude,
    longitude,
    days: Array.from({ length: days }, (_, i) => syntheticDay(latitude, longitude, addDaysIso(start, i))),
  };
}

/** Starts the fake on 127.0.0.1:`port` (0 for any free port); resolves once it listens. */
export function startForecastFake(opts: { port: number }): Promise<{ server: Server; url: string }> {
  const server = createServer((req, res) => {
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { "Content-Type": "application/json" });
      res.end(JSON.stringify(body));
    };
    const url = new URL(req.url ?? "/", "http://localhost");
    if (req.method !== "GET" || url.pathname !== "/v1/forecast") return send(404, { error: "not found" });
    const latitude = Number(url.searchParams.get("latitude"));
    const longitude = Number(url.searchParams.get("longitude"));
    const days = Number(url.searchParams.get("days") ?? 7);
    const start = url.searchParams.get("start") ?? new Date().toISOString().slice(0, 10);
    if (!url.searchParams.has("latitude") || !Number.isFinite(latitude) || Math.abs(latitude) > 90)
      return send(400, { error: "latitude must be -90 to 90" });
    if (!url.searchParams.has("longitude") || !Number.isFinite(longitude) || Math.abs(longitude) > 180)
      return send(400, { error: "longitude must be -180 to 180" });
    if (!Number.isInteger(days) || days < 1 || days > 16) return send(400, { error: "days must be 1 to 16" });
    if (!/^\d{4}-\d{2}-\d{2}$/.test(start)) return send(400, { error: "start must be YYYY-MM-DD" });
    send(200, forecastFor(latitude, longitude, start, days));
  });
  return new Promise((resolve) => {
    server.listen(opts.port, "127.0.0.1", () => {
      const address = server.address();
      const port = typeof address === "object" && address ? address.port : opts.port;
      resolve({ server, url: `http://127.0.0.1:${port}` });
    });
  });
}
