"use client";

import type { FieldDto, GaugeDto, ListOf, SoilDto, StationDto, SystemDto } from "@/lib/client/use-farm-setup";
import { useGauges, useSoils, useSystems } from "@/lib/client/use-farm-setup";
import { BoundaryImport } from "./boundary-import";
import { GaugesEditor, StationsEditor, SystemsEditor } from "./equipment";
import { FieldsSection } from "./fields-section";

export interface SetupPanelProps {
  farmId: string;
  centre: [number, number] | null;
  tileUrl: string | null;
  fields: ListOf<FieldDto>;
  gauges: ListOf<GaugeDto>;
  stations: ListOf<StationDto>;
  systems: ListOf<SystemDto>;
  soils: ListOf<SoilDto>;
}

/** The manager's set-up: fields and their outlines, boundary files, gauges, stations and systems. */
export function SetupPanel({ farmId, centre, tileUrl, ...initial }: SetupPanelProps) {
  const soils = useSoils(farmId, initial.soils).data ?? initial.soils;
  const systems = useSystems(farmId, initial.systems).data ?? initial.systems;
  const gauges = useGauges(farmId, initial.gauges).data ?? initial.gauges;
  return (
    <div className="flex flex-col gap-5">
      <FieldsSection
        farmId={farmId}
        initial={initial.fields}
        centre={centre}
        tileUrl={tileUrl}
        choices={{ soils: soils.data, systems: systems.data, gauges: gauges.data }}
      />
      <section aria-labelledby="import-heading" className="flex flex-col gap-3 rounded-2xl bg-white p-4 shadow-sm ring-1 ring-river-100">
        <h2 id="import-heading" className="text-xl font-bold">
          Outlines from a file
        </h2>
        <BoundaryImport farmId={farmId} />
      </section>
      <div className="grid gap-5 lg:grid-cols-2">
        <SystemsEditor farmId={farmId} initial={initial.systems} />
        <GaugesEditor farmId={farmId} initial={initial.gauges} />
        <StationsEditor farmId={farmId} initial={initial.stations} />
      </div>
    </div>
  );
}
