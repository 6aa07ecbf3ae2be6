"use client";

import { useState } from "react";
import { useUnits } from "@/lib/client/use-units";
import type { UnitSystem } from "@/lib/units";

/** Metric or imperial for the signed-in person, saved on their profile. */
export function UnitSwitch({ initial }: { initial: UnitSystem }) {
  const { units, setUnits } = useUnits(initial);
  const [problem, setProblem] = useState<string | null>(null);
  const choose = (next: UnitSystem) => {
    setProblem(null);
    setUnits(next).catch((err: unknown) => setProblem(err instanceof Error ? err.message : "Could not save the units."));
  };
  return (
    <div className="flex items-center gap-2">
      <div role="group" aria-label="Units" className="inline-flex rounded-xl bg-white p-0.5 ring-1 ring-river-300">
        {(["metric", "imperial"] as const).map((u) => (
          <button
            key={u}
            type="button"
            aria-pressed={units === u}
            onClick={() => choose(u)}
            className={`tap rounded-lg px-3 text-sm font-bold ${units === u ? "bg-river-700 text-white" : "text-river-900 hover:bg-river-50"}`}
          >
            {u === "metric" ? "Metric" : "Imperial"}
          </button>
        ))}
      </div>
      {problem && (
        <p role="alert" className="text-sm font-bold text-clay-700">
          {problem}
        </p>
      )}
    </div>
  );
}
