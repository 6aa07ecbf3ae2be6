import { existsSync } from "node:fs";
import path from "node:path";
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFarm } from "@/db/farms";
import { FarmMapView } from "@/components/map/farm-map-view";
import { requireFarmPage } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";

export const metadata: Metadata = { title: "Farm map" };

/** Gauges and stations show their last reading from this many days back (common practice, no source). */
const READINGS_DAYS = 14;

/**
 * The tile URL the map uses, or null for the plain local background: a local URL whose folder under
 * public/ is not there would only fill the map with broken images.
 */
function tileUrl(): string | null {
  const url = env().MAP_TILE_URL;
  if (!url.startsWith("/")) return url;
  const folder = url.slice(0, url.indexOf("{") === -1 ? undefined : url.indexOf("{"));
  return existsSync(path.join(process.cwd(), "public", folder)) ? url : null;
}

export default async function FarmMapPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user } = await requireFarmPage(farmId, "view");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  const today = farmToday(farm.timeZone);
  return (
    // The map takes the screen below the farm header, edge to edge, out of the page's centred column.
    <div className="relative left-1/2 -my-5 h-[calc(100dvh-7.5rem)] w-screen -translate-x-1/2">
      <FarmMapView farmId={farmId} today={today} readingsFrom={addDaysIso(today, -READINGS_DAYS)} tileUrl={tileUrl()} initialUnits={user.unitSystem} />
    </div>
  );
}
