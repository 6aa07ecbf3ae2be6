import { existsSync } from "node:fs";
import path from "node:path";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { SetupPanel } from "@/components/setup/setup-panel";
import { getFarm } from "@/db/farms";
import { listFields } from "@/db/fields";
import { listGauges } from "@/db/gauges";
import { listIrrigationSystems } from "@/db/irrigation-systems";
import { listSoils } from "@/db/soils";
import { listWeatherStations } from "@/db/weather-stations";
import { requireFarmPage } from "@/lib/auth/session";
import { env } from "@/lib/env";

export const metadata: Metadata = { title: "Set-up" };

const ALL = { limit: 1000, offset: 0 };

/** The tile URL to draw under the fields; the local default only when tiles were generated into public/tiles. */
function tileUrl(): string | null {
  const url = env().MAP_TILE_URL;
  if (/^https?:\/\//.test(url)) return url;
  return existsSync(path.join(process.cwd(), "public", "tiles")) ? url : null;
}

export default async function SetupPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "editSetup");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  const [fields, gauges, stations, systems, soils] = await Promise.all([
    listFields(farmId, ALL),
    listGauges(farmId, ALL),
    listWeatherStations(farmId, ALL),
    listIrrigationSystems(farmId, ALL),
    listSoils(farmId, ALL),
  ]);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Farm set-up</h1>
      <p className="text-ink/80">Fields and their outlines, rain gauges, weather stations and irrigation systems. Soils, crops and plantings are set with the agronomy tools.</p>
      <SetupPanel
        farmId={farmId}
        centre={farm.latitude !== null && farm.longitude !== null ? [farm.latitude, farm.longitude] : null}
        tileUrl={tileUrl()}
        fields={{ data: fields.rows }}
        gauges={{ data: gauges.rows }}
        stations={{ data: stations.rows }}
        systems={{ data: systems.rows }}
        soils={{ data: soils.rows }}
      />
    </div>
  );
}
