"use client";

import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useCallback, useMemo, useState } from "react";
import { Notice } from "@/components/ui/notice";
import { useFarmStatus } from "@/lib/client/use-farm-status";
import { useFields } from "@/lib/client/use-fields";
import { useGauges, useRecentRainReadings } from "@/lib/client/use-gauges";
import { useRecentWeatherDays, useStations } from "@/lib/client/use-stations";
import { useUnits } from "@/lib/client/use-units";
import { formatDepth, formatLocalDate, formatTemperature, type UnitSystem } from "@/lib/units";
import { BandLegend } from "./band-swatch";
import { byUrgency, mapBand, triggerShort } from "./bands";
import { FieldList } from "./field-list";
import type { MapField, MapPoint } from "./leaflet-map";
import { UnitSwitch } from "./unit-switch";

// Leaflet touches `window` when it loads, so the map only ever renders in the browser.
const LeafletMap = dynamic(() => import("./leaflet-map").then((m) => m.LeafletMap), {
  ssr: false,
  loading: () => <p className="p-4 text-ink/75">Drawing the farm map…</p>,
});

export interface FarmMapViewProps {
  farmId: string;
  today: string;
  /** the first day of recent readings shown beside gauges and stations */
  readingsFrom: string;
  tileUrl: string | null;
  initialUnits: UnitSystem;
}

/** The farm map with its list of fields: a toggle on phones, side by side on wide screens. */
export function FarmMapView({ farmId, today, readingsFrom, tileUrl, initialUnits }: FarmMapViewProps) {
  const router = useRouter();
  const { units } = useUnits(initialUnits);
  const [view, setView] = useState<"map" | "list">("map");
  const status = useFarmStatus(farmId);
  const fields = useFields(farmId);
  const gauges = useGauges(farmId);
  const stations = useStations(farmId);
  const readings = useRecentRainReadings(farmId, readingsFrom);
  const weather = useRecentWeatherDays(farmId, readingsFrom);

  const sorted = useMemo(() => [...(status.data?.data ?? [])].sort(byUrgency), [status.data]);

  const mapFields = useMemo<MapField[]>(() => {
    const byId = new Map((status.data?.data ?? []).map((s) => [s.id, s]));
    return (fields.data ?? []).map((f) => {
      const s = byId.get(f.id);
      const label = !s || s.depletionMm === null ? "no account" : `${formatDepth(s.depletionMm, units)} · ${triggerShort(s)}`;
      return {
        id: f.id,
        name: f.name,
        boundary: f.boundary,
        centroid: f.centroidLat !== null && f.centroidLon !== null ? [f.centroidLat, f.centroidLon] : null,
        band: s ? mapBand(s) : "unknown",
        label,
      };
    });
  }, [fields.data, status.data, units]);

  const points = useMemo<MapPoint[]>(() => {
    const out: MapPoint[] = [];
    const lastRain = new Map<string, { rainDate: string; depthMm: number; trace: boolean }>();
    for (const r of readings.data?.data ?? []) if (!lastRain.has(r.gaugeId)) lastRain.set(r.gaugeId, r);
    for (const g of gauges.data?.data ?? []) {
      if (g.latitude === null || g.longitude === null) continue;
      const r = lastRain.get(g.id);
      const reading = r ? `${r.trace ? "trace" : formatDepth(r.depthMm, units, 1)} on ${formatLocalDate(r.rainDate)}` : "no reading this fortnight";
      out.push({ id: g.id, kind: "gauge", name: g.name, position: [g.latitude, g.longitude], lastReading: reading });
    }
    const lastDay = new Map<string, { date: string; tmaxC: number | null; etoMm: number | null }>();
    for (const d of weather.data?.data ?? []) lastDay.set(d.stationId, d);
    for (const s of stations.data?.data ?? []) {
      if (s.latitude === null || s.longitude === null) continue;
      const d = lastDay.get(s.id);
      const reading = d
        ? `${formatLocalDate(d.date)}: max ${formatTemperature(d.tmaxC, units, 0)}${d.etoMm !== null ? `, ETo ${formatDepth(d.etoMm, units, 1)}` : ""}`
        : "no day this fortnight";
      out.push({ id: s.id, kind: "station", name: s.name, position: [s.latitude, s.longitude], lastReading: reading });
    }
    return out;
  }, [gauges.data, stations.data, readings.data, weather.data, units]);

  const openField = useCallback((id: string) => router.push(`/farms/${farmId}/fields/${id}`), [router, farmId]);
  const error = status.error ?? fields.error;

  return (
    <div className="flex h-full min-h-0 flex-col">
      <div className="flex flex-wrap items-center justify-between gap-2 px-4 py-2">
        <div>
          <h1 className="text-2xl font-bold">Farm map</h1>
          <p className="text-sm text-ink/75">Water accounts to the end of yesterday · today is {formatLocalDate(today, "long")} on the farm</p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <div role="group" aria-label="Show" className="inline-flex rounded-xl bg-white p-0.5 ring-1 ring-river-300 lg:hidden">
            {(["map", "list"] as const).map((v) => (
              <button
                key={v}
                type="button"
                aria-pressed={view === v}
                onClick={() => setView(v)}
                className={`tap rounded-lg px-4 text-sm font-bold ${view === v ? "bg-river-700 text-white" : "text-river-900 hover:bg-river-50"}`}
              >
                {v === "map" ? "Map" : "List"}
              </button>
            ))}
          </div>
          <UnitSwitch initial={initialUnits} />
        </div>
      </div>
      {error && (
        <div className="px-4 pb-2">
          <Notice tone="problem">Could not load the fields: {error instanceof Error ? error.message : "unknown error"}</Notice>
        </div>
      )}
      <div className="flex min-h-0 flex-1">
        <section aria-label="Fields" className={`min-h-0 w-full overflow-y-auto bg-white lg:block lg:w-96 lg:border-r lg:border-river-100 ${view === "list" ? "block" : "hidden"}`}>
          {status.isLoading ? <p className="p-4 text-ink/75">Loading the fields…</p> : <FieldList farmId={farmId} statuses={sorted} units={units} />}
        </section>
        <section aria-label="Map" className={`relative min-h-0 flex-1 lg:block ${view === "map" ? "block" : "hidden"}`}>
          {fields.data && status.data ? (
            <LeafletMap fields={mapFields} points={points} tileUrl={tileUrl} onOpenField={openField} />
          ) : (
            <p className="p-4 text-ink/75">Loading the farm map…</p>
          )}
          <BandLegend className="absolute right-3 bottom-3 z-[1000]" />
        </section>
      </div>
    </div>
  );
}
