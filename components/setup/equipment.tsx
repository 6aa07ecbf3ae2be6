"use client";

import { setupKeys, useGauges, useStations, useSystems, type GaugeDto, type ListOf, type StationDto, type SystemDto } from "@/lib/client/use-farm-setup";
import { GAUGE_KINDS } from "@/lib/validation/gauge";
import { SYSTEM_KINDS } from "@/lib/validation/irrigation-system";
import { RecordEditor, type InputSpec } from "./record-editor";

const SYSTEM_LABELS: Record<(typeof SYSTEM_KINDS)[number], string> = {
  drip: "Drip",
  micro: "Micro-sprinkler",
  pivot: "Centre pivot",
  linear: "Linear move",
  solid_set: "Solid set",
  hand_move: "Hand-move lines",
  traveller: "Travelling gun",
  furrow: "Furrow",
  flood: "Flood / border check",
};

const LOCATION: InputSpec[] = [
  { key: "latitude", label: "Latitude (°)", type: "number", nullable: true, hint: "decimal degrees, south negative" },
  { key: "longitude", label: "Longitude (°)", type: "number", nullable: true },
];

const GAUGE_SPECS: InputSpec[] = [
  { key: "name", label: "Name", type: "text" },
  { key: "kind", label: "Kind", type: "select", options: GAUGE_KINDS.map((k) => ({ value: k, label: k === "manual" ? "Manual (read by hand)" : "Recording (tips or logger)" })) },
  ...LOCATION,
  { key: "resolutionMm", label: "Resolution (mm)", type: "number", nullable: true, hint: "a tip of the bucket, e.g. 0.2" },
];

const STATION_SPECS: InputSpec[] = [
  { key: "name", label: "Name", type: "text" },
  ...LOCATION,
  { key: "elevationM", label: "Elevation (m)", type: "number", nullable: true },
  { key: "windHeightM", label: "Anemometer height (m)", type: "number", hint: "2 m is the standard height" },
  { key: "coastal", label: "Within sight of the sea (coastal)", type: "checkbox" },
];

const SYSTEM_SPECS: InputSpec[] = [
  { key: "name", label: "Name", type: "text" },
  { key: "kind", label: "Type", type: "select", options: SYSTEM_KINDS.map((k) => ({ value: k, label: SYSTEM_LABELS[k] })) },
  { key: "applicationEfficiency", label: "Application efficiency (0-1)", type: "number", hint: "0.85 means 85 % reaches the root zone" },
  { key: "flowM3H", label: "Flow rate (m³/h)", type: "number", nullable: true },
  { key: "capacityMmDay", label: "System capacity (mm/day)", type: "number", nullable: true },
  { key: "depthPerPassMm", label: "Depth per pass (mm)", type: "number", nullable: true },
  { key: "pumpName", label: "Pump", type: "text", nullable: true, hint: "systems on one pump share its capacity" },
];

const place = (lat: number | null, lon: number | null) => (lat !== null && lon !== null ? `${lat.toFixed(4)}, ${lon.toFixed(4)}` : "no location");

export function GaugesEditor({ farmId, initial }: { farmId: string; initial: ListOf<GaugeDto> }) {
  const { data = initial } = useGauges(farmId, initial);
  return (
    <RecordEditor
      title="Rain gauges"
      noun="gauge"
      collectionUrl={`/api/v1/farms/${farmId}/gauges`}
      listKey={setupKeys.gauges(farmId)}
      items={data.data}
      specs={GAUGE_SPECS}
      defaults={{ kind: "manual" }}
      describe={(g) => `${g.kind} · ${place(g.latitude, g.longitude)}`}
    />
  );
}

export function StationsEditor({ farmId, initial }: { farmId: string; initial: ListOf<StationDto> }) {
  const { data = initial } = useStations(farmId, initial);
  return (
    <RecordEditor
      title="Weather stations"
      noun="station"
      collectionUrl={`/api/v1/farms/${farmId}/stations`}
      listKey={setupKeys.stations(farmId)}
      items={data.data}
      specs={STATION_SPECS}
      defaults={{ windHeightM: "2", coastal: false }}
      describe={(st) => `${place(st.latitude, st.longitude)} · ${st.elevationM ?? "?"} m · wind at ${st.windHeightM} m`}
    />
  );
}

export function SystemsEditor({ farmId, initial }: { farmId: string; initial: ListOf<SystemDto> }) {
  const { data = initial } = useSystems(farmId, initial);
  return (
    <RecordEditor
      title="Irrigation systems"
      noun="system"
      collectionUrl={`/api/v1/farms/${farmId}/systems`}
      listKey={setupKeys.systems(farmId)}
      items={data.data}
      specs={SYSTEM_SPECS}
      defaults={{ kind: "pivot", applicationEfficiency: "0.85" }}
      describe={(sys) => {
        const parts = [SYSTEM_LABELS[sys.kind], `efficiency ${sys.applicationEfficiency}`];
        if (sys.flowM3H !== null) parts.push(`${sys.flowM3H} m³/h`);
        if (sys.capacityMmDay !== null) parts.push(`${sys.capacityMmDay} mm/day`);
        if (sys.pumpName) parts.push(`pump ${sys.pumpName}`);
        return parts.join(" · ");
      }}
    />
  );
}
