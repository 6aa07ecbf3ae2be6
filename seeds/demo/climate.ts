/**
 * Invented but plausible weather for the irrigation country of the Riverina, NSW (semi-arid, about 400 mm
 * of rain a year spread evenly, cool winters, hot dry summers). Everything about a day is drawn from streams
 * keyed by that date (and its neighbours, for spells of weather), so a day's values never depend on the
 * run date. The climatology is a sketch from memory of the region, not station normals.
 */
import { addDays, dayOfYear, localInstant } from "./dates";
import { round, stream } from "./random";

/** A storm's hyetograph: consecutive pieces of steady intensity, depths at the reference point. */
export interface Storm {
  key: string;
  convective: boolean;
  pieces: { startMs: number; endMs: number; depthMm: number }[];
}

/** Chance of a storm starting on a day, by month (index 0 = January): wetter winter, showery summer. */
const STORM_CHANCE = [0.12, 0.13, 0.13, 0.15, 0.17, 0.2, 0.22, 0.22, 0.2, 0.2, 0.17, 0.14];

/** The storm (at most one) that starts on a local day; `salt` separates the two farms' weather. */
export function stormStartingOn(date: string, timeZone: string, salt: string): Storm | undefined {
  const s = stream(salt, date, "storm");
  const month = Number(date.slice(5, 7)) - 1;
  if (s.next() >= STORM_CHANCE[month]!) return undefined;
  // Thunderstorms come with the heat (October to March); winter rain is frontal and steady.
  const warm = month >= 9 || month <= 2;
  const convective = warm && s.next() < 0.55;
  const key = `${salt}|${date}`;
  if (!convective) {
    const depthMm = Math.min(45, 0.4 + s.exponential(5.5));
    const startH = s.between(0, 24);
    const hours = s.between(3, 12);
    const n = 4 + Math.floor(s.next() * 5);
    const weights = Array.from({ length: n }, () => 0.05 + s.next() ** 2);
    const total = weights.reduce((a, b) => a + b, 0);
    const t0 = localInstant(date, startH, timeZone).getTime();
    const stepMs = (hours * 3_600_000) / n;
    return {
      key,
      convective,
      pieces: weights.map((w, i) => ({
        startMs: t0 + i * stepMs,
        endMs: t0 + (i + 1) * stepMs,
        depthMm: (depthMm * w) / total,
      })),
    };
  }
  // A late-afternoon cell: a short lead-in, a burst carrying most of the rain, then a trailing shower.
  const depthMm = Math.min(70, 2 + s.exponential(11));
  const t0 = localInstant(date, s.between(13, 20), timeZone).getTime();
  const leadMin = s.between(5, 20);
  const burstMin = s.between(10, 25);
  const tailMin = s.between(20, 110);
  const burstShare = s.between(0.55, 0.75);
  const leadShare = (1 - burstShare) * 0.3;
  const m = 60_000;
  return {
    key,
    convective,
    pieces: [
      { startMs: t0, endMs: t0 + leadMin * m, depthMm: depthMm * leadShare },
      { startMs: t0 + leadMin * m, endMs: t0 + (leadMin + burstMin) * m, depthMm: depthMm * burstShare },
      {
        startMs: t0 + (leadMin + burstMin) * m,
        endMs: t0 + (leadMin + burstMin + tailMin) * m,
        depthMm: depthMm * (1 - burstShare - leadShare),
      },
    ],
  };
}

/** Storms starting from `from` to `to` (local days, both included). */
export function stormsBetween(from: string, to: string, timeZone: string, salt: string): Storm[] {
  const out: Storm[] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) {
    const storm = stormStartingOn(d, timeZone, salt);
    if (storm) out.push(storm);
  }
  return out;
}

/**
 * How much more or less than the reference point a gauge catches in one storm: a few per cent for frontal
 * rain, much more across a farm under a thunderstorm cell.
 */
export function catchFactor(storm: Storm, place: string): number {
  const s = stream(storm.key, place, "catch");
  return storm.convective ? s.between(0.65, 1.35) : s.between(0.9, 1.1);
}

/** Depth of a storm at the reference point between two instants (steady within each piece). */
export function depthBetween(storm: Storm, fromMs: number, toMs: number): number {
  let sum = 0;
  for (const p of storm.pieces) {
    const overlap = Math.min(p.endMs, toMs) - Math.max(p.startMs, fromMs);
    if (overlap > 0) sum += (p.depthMm * overlap) / (p.endMs - p.startMs);
  }
  return sum;
}

/** Saturation vapour pressure, kPa (FAO-56 eq. 11). */
function es(tC: number): number {
  return 0.6108 * Math.exp((17.27 * tC) / (tC + 237.3));
}

/** Extraterrestrial radiation, MJ m-2 day-1 (FAO-56 eq. 21-25). */
export function extraterrestrialMJm2(latitude: number, date: string): number {
  const j = dayOfYear(date);
  const phi = (latitude * Math.PI) / 180;
  const dr = 1 + 0.033 * Math.cos((2 * Math.PI * j) / 365);
  const delta = 0.409 * Math.sin((2 * Math.PI * j) / 365 - 1.39);
  const ws = Math.acos(-Math.tan(phi) * Math.tan(delta));
  return (
    ((24 * 60) / Math.PI) *
    0.082 *
    dr *
    (ws * Math.sin(phi) * Math.sin(delta) + Math.cos(phi) * Math.cos(delta) * Math.sin(ws))
  );
}

/** Seasonal mean of the day: 1 at the warmest (about 20 January), -1 at the coolest (about 21 July). */
function season(date: string): number {
  return Math.cos((2 * Math.PI * (dayOfYear(date) - 20)) / 365.25);
}

/** Temperature anomaly that persists for a few days (warm and cool spells), °C. */
function spell(date: string, salt: string): number {
  const weights = [0.45, 0.3, 0.15, 0.1];
  let sum = 0;
  weights.forEach((w, k) => {
    sum += w * stream(salt, addDays(date, -k), "spell").normal();
  });
  return sum * 4.2;
}

export interface WeatherDay {
  date: string;
  tmax_c: number;
  tmin_c: number;
  rh_max_pct: number | null;
  rh_min_pct: number | null;
  rh_mean_pct: number | null;
  wind_ms: number | null;
  solar_mj_m2: number | null;
  rain_mm: number;
  flagged: boolean;
  flag_reason: string | null;
}

export interface StationSite {
  latitude: number;
  elevationM: number;
  salt: string;
}

/**
 * One observed day at a station. `rainMm` is the station's own gauge for the local calendar day and
 * `stormTomorrow` says whether a front arrives next day (hot, windy days come before a change).
 */
export function weatherDay(
  site: StationSite,
  date: string,
  rainMm: number,
  stormTomorrow: boolean,
): WeatherDay {
  const s = stream(site.salt, date, "weather");
  const sea = season(date);
  const anomaly = spell(date, site.salt);
  const wet = rainMm >= 1;

  let tmax = 23.5 + 9 * sea + anomaly + s.normal() * 1.2;
  let tmin = 10.5 + 7 * sea + 0.6 * anomaly + s.normal() * 1.5;
  if (wet) {
    tmax -= s.between(2, 6);
    tmin += s.between(0, 2); // cloud keeps the night warm
  }
  if (stormTomorrow && !wet) tmax += s.between(1, 3);
  if (tmax - tmin < 3) tmin = tmax - s.between(3, 5);

  // Humidity from a dew point below the minimum temperature: close to it in winter and on wet days,
  // well below it in the dry inland summer.
  const dewGap = wet ? s.between(0, 1.5) : 0.5 + 2.8 * (1 + sea) + s.between(-1, 1.5);
  const ea = es(tmin - dewGap);
  const rhMax = Math.min(100, (100 * ea) / es(tmin));
  const rhMin = Math.min(rhMax, (100 * ea) / es(tmax));

  // 2 m wind: calm winter mornings, breezy spring; fronts bring the strongest days.
  let wind =
    (2.1 + 0.4 * Math.sin((2 * Math.PI * (dayOfYear(date) - 250)) / 365.25)) * Math.exp(0.3 * s.normal());
  if (stormTomorrow || wet) wind += s.between(0.5, 1.8);
  wind = Math.min(5, Math.max(1, wind));

  // Solar radiation below the clear-sky bound Rso = (0.75 + 2e-5 z) Ra (FAO-56 eq. 37).
  const rso = (0.75 + 2e-5 * site.elevationM) * extraterrestrialMJm2(site.latitude, date);
  const clearness = wet
    ? s.between(0.3, 0.65)
    : s.next() < 0.15
      ? s.between(0.45, 0.8)
      : s.between(0.85, 0.98);

  const day: WeatherDay = {
    date,
    tmax_c: round(tmax, 1),
    tmin_c: round(tmin, 1),
    rh_max_pct: round(rhMax, 0),
    rh_min_pct: round(rhMin, 0),
    rh_mean_pct: round((rhMax + rhMin) / 2, 0),
    wind_ms: round(wind, 1),
    solar_mj_m2: round(rso * clearness, 1),
    rain_mm: rainMm,
    flagged: false,
    flag_reason: null,
  };
  return withOutages(day);
}

/**
 * Sensor outages and faults on fixed days of the year, so the account has estimated inputs to mark and
 * quality control has a flagged value to show: pyranometer away for calibration in mid-September, the
 * anemometer seized for two days in late October, the humidity sensor stuck at saturation in November.
 */
function withOutages(day: WeatherDay): WeatherDay {
  const md = day.date.slice(5);
  if (md >= "09-14" && md <= "09-17") return { ...day, solar_mj_m2: null };
  if (md === "10-27" || md === "10-28") return { ...day, wind_ms: null };
  if (md === "11-09") {
    return {
      ...day,
      rh_max_pct: 100,
      rh_min_pct: 100,
      rh_mean_pct: 100,
      flagged: true,
      flag_reason: "Humidity sensor read 100 % all day on a dry day: sensor stuck",
    };
  }
  return day;
}

/** Hargreaves reference ET, mm/day (FAO-56 eq. 52): the seed's own rough guide for scheduling only. */
export function hargreavesEtoMm(latitude: number, day: WeatherDay): number {
  const ra = extraterrestrialMJm2(latitude, day.date);
  const tmean = (day.tmax_c + day.tmin_c) / 2;
  return 0.0023 * (tmean + 17.8) * Math.sqrt(Math.max(0, day.tmax_c - day.tmin_c)) * 0.408 * ra;
}
