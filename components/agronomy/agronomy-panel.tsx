"use client";

import { useState } from "react";
import { Notice } from "@/components/ui/notice";
import { useCrop, usePlanting } from "@/lib/client/use-agronomy";
import { CalibrationPanel } from "./calibration-panel";
import { CurveEditor } from "./curve-editor";
import { HistoryPanel } from "./history-panel";
import { LibraryPanel } from "./library-panel";

export interface PlantingChoice {
  id: string;
  label: string;
  plantingDate: string;
}

type View = "curve" | "calibration" | "history" | "library";
const VIEWS: { id: View; label: string }[] = [
  { id: "curve", label: "Crop curve" },
  { id: "calibration", label: "Calibration" },
  { id: "history", label: "History" },
  { id: "library", label: "Soils and crops" },
];

function PlantingTools({
  farmId,
  plantingId,
  view,
}: {
  farmId: string;
  plantingId: string;
  view: Exclude<View, "library">;
}) {
  const planting = usePlanting(farmId, plantingId);
  const crop = useCrop(farmId, planting.data?.planting.cropId ?? null);
  const [version, setVersion] = useState(0);
  const refresh = () => {
    void planting.mutate();
    setVersion((v) => v + 1);
  };
  if (planting.error || crop.error)
    return <Notice tone="problem">{(planting.error ?? crop.error)!.message}</Notice>;
  if (!planting.data || !crop.data) return <p className="text-ink/70">Loading the planting…</p>;
  if (view === "curve")
    return (
      <CurveEditor
        farmId={farmId}
        planting={planting.data.planting}
        crop={crop.data.crop}
        onSaved={refresh}
      />
    );
  if (view === "calibration")
    return <CalibrationPanel key={version} farmId={farmId} plantingId={plantingId} onSaved={refresh} />;
  return <HistoryPanel farmId={farmId} kind="plantings" id={plantingId} title="Changes to this planting" />;
}

/** The agronomy screen: a planting's curve, calibration and history, and the soil and crop library. */
export function AgronomyPanel({ farmId, plantings }: { farmId: string; plantings: PlantingChoice[] }) {
  const [plantingId, setPlantingId] = useState<string | null>(plantings[0]?.id ?? null);
  const [view, setView] = useState<View>("curve");
  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Crop settings" className="flex gap-1 overflow-x-auto">
        {VIEWS.map((v) => (
          <button
            key={v.id}
            type="button"
            aria-pressed={view === v.id}
            onClick={() => setView(v.id)}
            className={`tap shrink-0 whitespace-nowrap rounded-lg px-3 font-bold ${view === v.id ? "bg-river-700 text-white" : "text-river-700 hover:bg-river-50"}`}
          >
            {v.label}
          </button>
        ))}
      </nav>
      {view !== "library" && (
        <>
          {plantings.length === 0 ? (
            <p className="text-ink/70">No plantings yet. Add one to a field first.</p>
          ) : (
            <label className="flex flex-col gap-1 text-sm font-bold">
              Planting
              <select
                className="tap w-full min-w-0 rounded-xl border border-river-300 bg-white px-2 py-2 text-base font-normal"
                value={plantingId ?? ""}
                onChange={(e) => setPlantingId(e.target.value)}
              >
                {plantings.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.label} (sown {p.plantingDate})
                  </option>
                ))}
              </select>
            </label>
          )}
          {plantingId && (
            <PlantingTools key={plantingId} farmId={farmId} plantingId={plantingId} view={view} />
          )}
        </>
      )}
      {view === "library" && <LibraryPanel farmId={farmId} />}
    </div>
  );
}
