import type { Metadata } from "next";
import { AgronomyPanel, type PlantingChoice } from "@/components/agronomy/agronomy-panel";
import { listCrops } from "@/db/crops";
import { listFields } from "@/db/fields";
import { listPlantings } from "@/db/plantings";
import { requireFarmPage } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Crop settings" };

const ALL = { limit: 1000, offset: 0 };

export default async function AgronomyPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "editAgronomy");
  const [plantings, fields, crops] = await Promise.all([
    listPlantings(farmId, ALL),
    listFields(farmId, ALL),
    listCrops(farmId, ALL),
  ]);
  const fieldName = new Map(fields.rows.map((f) => [f.id, f.name]));
  const cropName = new Map(crops.rows.map((c) => [c.id, c.name]));
  const choices: PlantingChoice[] = plantings.rows
    .filter((p) => fieldName.has(p.fieldId))
    .map((p) => ({
      id: p.id,
      label: `${fieldName.get(p.fieldId)} · ${cropName.get(p.cropId) ?? "crop"} · ${p.season}`,
      plantingDate: p.plantingDate,
    }));
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Crop settings</h1>
      <p className="text-ink/80">
        Tune each planting&apos;s crop curve against what the field shows, calibrate it from soil checks, and
        keep the farm&apos;s own soils and crops. Every saved change names who made it and why.
      </p>
      <AgronomyPanel farmId={farmId} plantings={choices} />
    </div>
  );
}
