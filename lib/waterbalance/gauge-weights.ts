import { requireNonNegative, requirePositive, requireRange } from "./errors";

/** Rain for a field without its own gauge: nearest gauge, or inverse-distance weighting within a radius. */

/** A point on the farm, decimal degrees. */
export interface LatLon {
  latitudeDeg: number;
  longitudeDeg: number;
}

/** A gauge's reading for the day; `rainMm` null when the gauge was not read (missing, not zero). */
export interface GaugeReading extends LatLon {
  gaugeId: string;
  rainMm: number | null;
}

/** One gauge that contributed to a field's rain. */
export interface GaugeWeight {
  gaugeId: string;
  distanceKm: number;
  weight: number;
}

/** Rain assigned to a field, with the gauges and weights that made it. */
export interface InterpolatedRain {
  /** null when no gauge with a reading was within the radius */
  rainMm: number | null;
  method: "nearest" | "idw";
  gauges: GaugeWeight[];
}

/** Great-circle distance (km) between two points, haversine formula on a 6371 km sphere. */
export function distanceKm(a: LatLon, b: LatLon): number {
  requireRange("latitudeDeg", a.latitudeDeg, -90, 90);
  requireRange("latitudeDeg", b.latitudeDeg, -90, 90);
  const toRad = Math.PI / 180;
  const dLat = (b.latitudeDeg - a.latitudeDeg) * toRad;
  const dLon = (b.longitudeDeg - a.longitudeDeg) * toRad;
  const s =
    Math.sin(dLat / 2) ** 2 +
    Math.cos(a.latitudeDeg * toRad) * Math.cos(b.latitudeDeg * toRad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(s)));
}

/** Options for {@link rainFromGauges}. */
export interface GaugeWeightOptions {
  /** 'idw' (default) or 'nearest' */
  method?: "nearest" | "idw";
  /** only gauges within this distance count, km (default 10) */
  radiusKm?: number;
  /** inverse-distance power (default 2, common practice, no source) */
  power?: number;
  /** at most this many nearest gauges (default 4) */
  maxGauges?: number;
}

/**
 * Rain for a point from nearby gauges. 'nearest' takes the closest gauge with a reading; 'idw'
 * weights gauges within the radius by 1/d^power (Shepard 1968), a gauge on the point taking all the
 * weight. Gauges without a reading are left out, never counted as zero.
 * @returns the rain (mm, or null when none is in range) and the gauges with their distances and weights
 */
export function rainFromGauges(
  target: LatLon,
  gauges: readonly GaugeReading[],
  options: GaugeWeightOptions = {},
): InterpolatedRain {
  const method = options.method ?? "idw";
  const radiusKm = requirePositive("radiusKm", options.radiusKm ?? 10);
  const power = requireNonNegative("power", options.power ?? 2);
  const maxGauges = Math.max(1, Math.floor(options.maxGauges ?? 4));
  const near = gauges
    .filter((g) => g.rainMm !== null)
    .map((g) => ({ g, d: distanceKm(target, g) }))
    .filter((x) => x.d <= radiusKm)
    .sort((x, y) => x.d - y.d || (x.g.gaugeId < y.g.gaugeId ? -1 : 1));
  for (const x of near) requireNonNegative(`rainMm (gauge ${x.g.gaugeId})`, x.g.rainMm as number);
  if (near.length === 0) return { rainMm: null, method, gauges: [] };
  const first = near[0]!;
  if (method === "nearest" || first.d < 1e-6) {
    return {
      rainMm: first.g.rainMm,
      method,
      gauges: [{ gaugeId: first.g.gaugeId, distanceKm: first.d, weight: 1 }],
    };
  }
  const used = near.slice(0, maxGauges);
  let sumW = 0;
  const raw = used.map((x) => {
    const w = 1 / Math.pow(x.d, power);
    sumW += w;
    return w;
  });
  let rain = 0;
  const out: GaugeWeight[] = used.map((x, k) => {
    const weight = raw[k]! / sumW;
    rain += weight * (x.g.rainMm as number);
    return { gaugeId: x.g.gaugeId, distanceKm: x.d, weight };
  });
  return { rainMm: rain, method, gauges: out };
}
