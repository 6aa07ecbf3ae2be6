import {
  etoForSpan,
  isoDateToDayNumber,
  windAt2mMs,
  type ClimateAdjustSpec,
  type EtoProvenance,
  type GivenEtoDay,
  type StageLengths,
  type StationSite,
  type WeatherDayInput,
} from "@/lib/waterbalance";

/**
 * Reference ET is a property of the station's day, not of the field: on a farm of two thousand fields
 * sharing one station, Penman-Monteith runs once per day instead of once per field-day. The engine's own
 * etoForSpan does the work (same equations, same gap filling over the same span), so the account a field
 * gets is the one it would get from raw weather; the day's method and estimated inputs are kept for the
 * provenance.
 */

export interface StationEto {
  /** ETo by day of the span, as the engine's given-ETo weather days */
  weather: GivenEtoDay[];
  provenance: EtoProvenance[];
}

export class StationEtoCache {
  private readonly cache = new Map<string, StationEto>();

  /** ETo of `stationId` for account days `from`..`to` (inclusive). */
  get(stationId: string, weather: readonly WeatherDayInput[], site: StationSite | undefined, from: string, to: string): StationEto {
    const key = `${stationId}|${from}|${to}`;
    let hit = this.cache.get(key);
    if (!hit) {
      const startDay = isoDateToDayNumber(from);
      const n = isoDateToDayNumber(to) - startDay + 1;
      const { etoMm, provenance } = etoForSpan({ weather, ...(site ? { station: site } : {}) }, startDay, n);
      const days: GivenEtoDay[] = new Array<GivenEtoDay>(n);
      let date = from;
      for (let d = 0; d < n; d++) {
        days[d] = { date, etoMm: etoMm[d]! };
        date = nextIsoDate(date);
      }
      hit = { weather: days, provenance };
      this.cache.set(key, hit);
    }
    return hit;
  }
}

const nextDates = new Map<string, string>();

/** The ISO date after `iso`; remembered, since a farm's recompute walks the same season once per field. */
export function nextIsoDate(iso: string): string {
  let next = nextDates.get(iso);
  if (next !== undefined) return next;
  const d = Number(iso.slice(8, 10));
  if (d < 28) next = `${iso.slice(0, 8)}${String(d + 1).padStart(2, "0")}`;
  else {
    const t = new Date(`${iso}T00:00:00Z`);
    t.setUTCDate(t.getUTCDate() + 1);
    next = t.toISOString().slice(0, 10);
  }
  if (nextDates.size >= 20_000) nextDates.clear();
  nextDates.set(iso, next);
  return next;
}

/**
 * The mid- and late-season wind (at 2 m) and minimum humidity of a planting, as the engine derives them
 * for its Kc adjustment (FAO-56 eq. 62 and 65: means over the mid and late stages of the station's raw
 * weather days). Given explicitly so the engine can take ETo as given values and still adjust Kc.
 */
export function climateMeansForPlanting(
  weather: readonly WeatherDayInput[],
  plantingDate: string,
  stages: StageLengths,
  windHeightM: number,
): ClimateAdjustSpec {
  const plantingDay = isoDateToDayNumber(plantingDate);
  const midFrom = stages.iniDays + stages.devDays + 1;
  const midTo = midFrom + stages.midDays - 1;
  const lateTo = midTo + stages.lateDays;
  const acc = { midW: 0, midWn: 0, midR: 0, midRn: 0, endW: 0, endWn: 0, endR: 0, endRn: 0 };
  for (const w of weather) {
    if ((w as { etoMm?: unknown }).etoMm !== undefined) continue;
    const raw = w as { date: string; windMs?: number; windHeightM?: number; rhMinPct?: number };
    const i = isoDateToDayNumber(raw.date) - plantingDay + 1;
    const isMid = i >= midFrom && i <= midTo;
    const isLate = i > midTo && i <= lateTo;
    if (!isMid && !isLate) continue;
    if (raw.windMs !== undefined) {
      const h = raw.windHeightM ?? windHeightM;
      const u2 = h === 2 ? raw.windMs : windAt2mMs(raw.windMs, h);
      if (isMid) {
        acc.midW += u2;
        acc.midWn++;
      } else {
        acc.endW += u2;
        acc.endWn++;
      }
    }
    if (raw.rhMinPct !== undefined) {
      if (isMid) {
        acc.midR += raw.rhMinPct;
        acc.midRn++;
      } else {
        acc.endR += raw.rhMinPct;
        acc.endRn++;
      }
    }
  }
  return {
    ...(acc.midWn ? { midWindMs: acc.midW / acc.midWn } : {}),
    ...(acc.midRn ? { midRhMinPct: acc.midR / acc.midRn } : {}),
    ...(acc.endWn ? { endWindMs: acc.endW / acc.endWn } : {}),
    ...(acc.endRn ? { endRhMinPct: acc.endR / acc.endRn } : {}),
  };
}
