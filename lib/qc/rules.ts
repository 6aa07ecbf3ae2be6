/**
 * Quality-control rules: each looks at values already stored and says which look wrong and why. A rule
 * never changes a value; the flags it raises are kept for a person to accept or override. Pure: the
 * caller loads the rows and stores the flags (lib/qc/run.ts).
 */
import { clearSkySolarMJm2, dayOfYear, distanceKm, extraterrestrialRadiationMJm2 } from "@/lib/waterbalance";

export type FlagEntity = "rain_reading" | "rain_record" | "weather_day";

export interface FlagCandidate {
  entity: FlagEntity;
  entityId: string;
  date: string;
  rule: string;
  message: string;
}

/**
 * Limits beyond which a value is suspect (not impossible: impossible values are refused on entry).
 * Common practice, no source, except where named.
 */
export const QC_LIMITS = {
  /** a day's rain at a farm gauge; heavier falls happen, rarely enough to deserve a second look */
  rainDayMm: 250,
  tmaxC: 50,
  tminC: -30,
  /** a day's temperature range; wider is a stuck or swapped sensor far more often than weather */
  diurnalRangeC: 30,
  /** humidity sensors rarely read below a few per cent; a day that never passes 15 % is a dry sensor */
  rhMinPct: 3,
  rhMaxPct: 15,
  /** a day whose humidity never fell below this, with no rain, is a stuck or wet sensor */
  rhStuckPct: 99,
  /** a daily mean wind above this at 2 m is a storm day or a faulty anemometer */
  windMs: 15,
  /** measured solar may exceed Rso (FAO-56 eq. 37) by sensor tolerance; a few per cent more is a fault */
  solarOverClearSky: 1.05,
  /**
   * shortest time between two real tips of a bucket; closer is switch bounce (REFERENCES facts of
   * practice). Even 200 mm/h fills a 0.2 mm bucket only every 3.6 s.
   */
  minTipGapS: 2,
  /** more rain than this in one minute from a tipping bucket is a burst: wind, knocks or maintenance */
  burstWindowS: 60,
  burstMm: 6,
  /** neighbour checks need this much rain at the neighbours to mean anything */
  neighbourWetMm: 5,
  /** a gauge below half or above twice its neighbours' median on a wet day */
  neighbourRatioLow: 0.5,
  neighbourRatioHigh: 2,
  /** gauges further apart than this are not neighbours */
  neighbourKm: 30,
} as const;

export interface WeatherDayQc {
  id: string;
  date: string;
  tmaxC: number | null;
  tminC: number | null;
  rhMaxPct: number | null;
  rhMinPct: number | null;
  windMs: number | null;
  solarMJm2: number | null;
  rainMm: number | null;
  latitude: number | null;
  elevationM: number | null;
}

/** Range checks and the clear-sky envelope for one observed weather day. */
export function weatherDayFlags(d: WeatherDayQc): FlagCandidate[] {
  const out: FlagCandidate[] = [];
  const flag = (rule: string, message: string) =>
    out.push({ entity: "weather_day", entityId: d.id, date: d.date, rule, message });
  const L = QC_LIMITS;
  if (d.rainMm !== null && d.rainMm > L.rainDayMm)
    flag("rain_range", `${d.rainMm} mm of rain in a day is above ${L.rainDayMm} mm`);
  if ((d.tmaxC !== null && d.tmaxC > L.tmaxC) || (d.tminC !== null && d.tminC < L.tminC)) {
    flag(
      "temperature_range",
      `temperatures ${d.tminC ?? "–"} to ${d.tmaxC ?? "–"} °C are outside ${L.tminC} to ${L.tmaxC} °C`,
    );
  } else if (d.tmaxC !== null && d.tminC !== null && d.tmaxC - d.tminC > L.diurnalRangeC) {
    flag(
      "temperature_range",
      `a ${(d.tmaxC - d.tminC).toFixed(1)} °C range in one day is above ${L.diurnalRangeC} °C`,
    );
  }
  if ((d.rhMinPct !== null && d.rhMinPct < L.rhMinPct) || (d.rhMaxPct !== null && d.rhMaxPct < L.rhMaxPct)) {
    flag(
      "humidity_range",
      `humidity ${d.rhMinPct ?? "–"} to ${d.rhMaxPct ?? "–"} % is below what the air near a farm reaches`,
    );
  }
  if (d.rhMinPct !== null && d.rhMinPct >= L.rhStuckPct && (d.rainMm === null || d.rainMm < 1)) {
    flag(
      "humidity_stuck",
      `humidity stayed at ${d.rhMinPct} % or more all day without rain: a stuck or wet sensor`,
    );
  }
  if (d.windMs !== null && d.windMs > L.windMs)
    flag("wind_range", `a daily mean wind of ${d.windMs.toFixed(1)} m/s is above ${L.windMs} m/s`);
  if (d.solarMJm2 !== null && d.latitude !== null) {
    const rso = clearSkySolarMJm2(
      extraterrestrialRadiationMJm2(d.latitude, dayOfYear(d.date)),
      d.elevationM ?? 0,
    );
    if (d.solarMJm2 > rso * L.solarOverClearSky) {
      flag(
        "solar_clear_sky",
        `${d.solarMJm2.toFixed(1)} MJ/m² is above the clear-sky radiation of ${rso.toFixed(1)} MJ/m² for this day and place`,
      );
    }
  }
  return out;
}

/** A gauge's rain on one account day, and the rows that make it up. */
export interface GaugeDay {
  gaugeId: string;
  date: string;
  depthMm: number;
  location: { latitudeDeg: number; longitudeDeg: number } | null;
  entity: "rain_reading" | "rain_record";
  entityIds: string[];
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? (s[mid] ?? 0) : ((s[mid - 1] ?? 0) + (s[mid] ?? 0)) / 2;
}

/**
 * Each gauge against the gauges around it on the same day: far from their median, or dry when they were
 * wet. The median is taken over the gauge and its neighbours together, so one broken gauge cannot make
 * a good one look odd; it needs two neighbours at least.
 */
export function neighbourFlags(days: readonly GaugeDay[]): FlagCandidate[] {
  const L = QC_LIMITS;
  const byDate = new Map<string, GaugeDay[]>();
  for (const d of days) byDate.set(d.date, [...(byDate.get(d.date) ?? []), d]);
  const out: FlagCandidate[] = [];
  for (const group of byDate.values()) {
    for (const d of group) {
      const neighbours = group.filter(
        (n) =>
          n.gaugeId !== d.gaugeId &&
          (!n.location || !d.location || distanceKm(n.location, d.location) <= L.neighbourKm),
      );
      if (neighbours.length < 2) continue;
      const m = median([d, ...neighbours].map((n) => n.depthMm));
      if (m < L.neighbourWetMm) continue;
      let rule: string | null = null;
      let message = "";
      if (d.depthMm === 0) {
        rule = "zero_when_neighbours_wet";
        message = `no rain here while the ${neighbours.length + 1} gauges around had a median of ${m.toFixed(1)} mm`;
      } else if (d.depthMm / m < L.neighbourRatioLow || d.depthMm / m > L.neighbourRatioHigh) {
        rule = "neighbour_ratio";
        message = `${d.depthMm.toFixed(1)} mm is ${(d.depthMm / m).toFixed(2)} × the median of ${m.toFixed(1)} mm across ${neighbours.length + 1} nearby gauges`;
      }
      if (rule)
        for (const id of d.entityIds)
          out.push({ entity: d.entity, entityId: id, date: d.date, rule, message });
    }
  }
  return out;
}

export interface TipQc {
  id: string;
  date: string;
  atMs: number;
  depthMm: number;
  /** the gauge's bucket size; null when unknown */
  resolutionMm: number | null;
}

/**
 * Double tips (closer than a bucket can tip twice, or two tips stamped alike and stored as one) and
 * bursts (more in a minute than a bucket records in real rain). `tips` are one gauge's, in time order.
 */
export function tipFlags(tips: readonly TipQc[]): FlagCandidate[] {
  const L = QC_LIMITS;
  const out: FlagCandidate[] = [];
  const seen = new Set<string>();
  const flag = (t: TipQc, rule: string, message: string) => {
    if (seen.has(`${t.id}|${rule}`)) return;
    seen.add(`${t.id}|${rule}`);
    out.push({ entity: "rain_record", entityId: t.id, date: t.date, rule, message });
  };
  let windowStart = 0;
  let windowMm = 0;
  tips.forEach((t, i) => {
    const prev = tips[i - 1];
    if (prev && t.atMs - prev.atMs < L.minTipGapS * 1000) {
      flag(
        t,
        "double_tip",
        `${((t.atMs - prev.atMs) / 1000).toFixed(2)} s after the tip before; a bucket needs at least ${L.minTipGapS} s`,
      );
    } else if (t.resolutionMm !== null && t.depthMm > t.resolutionMm * 1.5) {
      flag(t, "double_tip", `${t.depthMm} mm at one instant is more than one ${t.resolutionMm} mm tip`);
    }
    windowMm += t.depthMm;
    while (windowStart < i && t.atMs - (tips[windowStart]?.atMs ?? 0) > L.burstWindowS * 1000) {
      windowMm -= tips[windowStart]?.depthMm ?? 0;
      windowStart += 1;
    }
    if (windowMm > L.burstMm) {
      for (let j = windowStart; j <= i; j++) {
        const b = tips[j];
        if (b)
          flag(
            b,
            "tip_burst",
            `${windowMm.toFixed(1)} mm within ${L.burstWindowS} s is above ${L.burstMm} mm`,
          );
      }
    }
  });
  return out;
}

/** A manual reading above the day's rain limit. */
export function readingRangeFlag(r: { id: string; date: string; depthMm: number }): FlagCandidate | null {
  return r.depthMm > QC_LIMITS.rainDayMm
    ? {
        entity: "rain_reading",
        entityId: r.id,
        date: r.date,
        rule: "rain_range",
        message: `${r.depthMm} mm in a day is above ${QC_LIMITS.rainDayMm} mm`,
      }
    : null;
}
