"use client";

import { useState } from "react";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { formatNumber } from "@/lib/statement/format";

/**
 * A planting's yield in the productivity table. People who may edit plantings can enter or correct it
 * here after harvest; the statement is then read again so kg per m³ follow.
 */
export function YieldCell({
  farmId,
  plantingId,
  label,
  yieldTHa,
  canEdit,
  onSaved,
}: {
  farmId: string;
  plantingId: string;
  /** names the planting for screen readers, e.g. "Top Pivot, Maize 2026-27" */
  label: string;
  yieldTHa: number | null;
  canEdit: boolean;
  onSaved: () => Promise<unknown>;
}) {
  const [editing, setEditing] = useState(false);
  const [value, setValue] = useState(yieldTHa === null ? "" : String(yieldTHa));
  const [problem, setProblem] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  const shown = yieldTHa === null ? "not entered" : formatNumber(yieldTHa, 1);
  if (!canEdit) return <>{shown}</>;
  if (!editing) {
    return (
      <span className="inline-flex items-center gap-2">
        {shown}
        <button type="button" className="rounded-md px-2 py-1 font-bold text-river-700 underline print:hidden" onClick={() => setEditing(true)} aria-label={`Enter the yield of ${label}`}>
          {yieldTHa === null ? "Enter" : "Change"}
        </button>
      </span>
    );
  }
  const save = async () => {
    const trimmed = value.trim();
    const next = trimmed === "" ? null : Number(trimmed);
    if (next !== null && !Number.isFinite(next)) {
      setProblem("Type the yield as a number of tonnes per hectare, e.g. 11.5");
      return;
    }
    setSaving(true);
    setProblem(null);
    try {
      await sendJson(`/api/v1/farms/${farmId}/plantings/${plantingId}`, "PATCH", { yieldTHa: next });
      await onSaved();
      setEditing(false);
    } catch (err) {
      setProblem(err instanceof ApiError ? (err.fields.yieldTHa ?? err.message) : "Could not save the yield.");
    } finally {
      setSaving(false);
    }
  };
  return (
    <span className="inline-flex flex-col items-end gap-1">
      <span className="inline-flex items-center gap-1">
        <input
          type="number"
          inputMode="decimal"
          min={0}
          step="0.1"
          value={value}
          onChange={(e) => setValue(e.target.value)}
          aria-label={`Yield of ${label}, t/ha`}
          className="w-24 rounded-md border border-river-300 px-2 py-1 text-right"
        />
        <button type="button" disabled={saving} className="rounded-md bg-river-700 px-2 py-1 font-bold text-white disabled:opacity-60" onClick={() => void save()}>
          Save
        </button>
        <button type="button" className="rounded-md px-2 py-1 text-river-700" onClick={() => setEditing(false)}>
          Cancel
        </button>
      </span>
      {problem && (
        <span role="alert" className="text-xs text-clay-900">
          {problem}
        </span>
      )}
    </span>
  );
}
