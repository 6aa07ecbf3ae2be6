"use client";

import { area } from "@turf/area";
import dynamic from "next/dynamic";
import { useState } from "react";
import { useSWRConfig } from "swr";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { sendJson } from "@/lib/client/fetcher";
import { setupKeys, useFields, type FieldDto, type ListOf } from "@/lib/client/use-farm-setup";
import type { Boundary } from "@/lib/geo/boundary";
import { newEntryId } from "@/lib/offline/queue";
import type { MapMode } from "./boundary-map";
import { FieldForm, type FieldChoices } from "./field-form";

const BoundaryMap = dynamic(() => import("./boundary-map").then((m) => m.BoundaryMap), {
  ssr: false,
  loading: () => <div className="h-[55vh] min-h-72 w-full animate-pulse rounded-2xl bg-river-50" />,
});

/** Square metres per hectare. */
const M2_PER_HA = 10_000;

type Editing = { what: "field"; field: FieldDto | null } | null;

/** The farm's fields on the map: pick one, redraw or edit its outline, or draw a new field. */
export function FieldsSection({
  farmId,
  initial,
  choices,
  centre,
  tileUrl,
}: {
  farmId: string;
  initial: ListOf<FieldDto>;
  choices: FieldChoices;
  centre: [number, number] | null;
  tileUrl: string | null;
}) {
  const { mutate } = useSWRConfig();
  const { data = initial } = useFields(farmId, initial);
  const fields = data.data.filter((f) => f.archivedAt === null);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [mode, setMode] = useState<MapMode>("view");
  const [shape, setShape] = useState<Boundary | null>(null);
  const [editing, setEditing] = useState<Editing>(null);
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);
  const selected = fields.find((f) => f.id === selectedId) ?? null;
  const shapeHa = shape ? area(shape) / M2_PER_HA : null;

  function reset() {
    setMode("view");
    setShape(null);
  }

  async function saveOutline() {
    if (!shape) return;
    try {
      if (selected) {
        const { field } = await sendJson<{ field: FieldDto }>(`/api/v1/farms/${farmId}/fields/${selected.id}`, "PATCH", { boundary: shape });
        setMessage({ tone: "success", text: `Outline of ${field.name} saved: ${field.areaHa.toFixed(2)} ha.` });
        reset();
      } else {
        setEditing({ what: "field", field: null });
        setMode("view");
      }
      await mutate(setupKeys.fields(farmId));
    } catch (err) {
      setMessage({ tone: "problem", text: err instanceof Error ? err.message : "The outline could not be saved." });
    }
  }

  async function saveField(body: Record<string, unknown>) {
    const existing = editing?.field ?? null;
    const { field } = existing
      ? await sendJson<{ field: FieldDto }>(`/api/v1/farms/${farmId}/fields/${existing.id}`, "PATCH", body)
      : await sendJson<{ field: FieldDto }>(`/api/v1/farms/${farmId}/fields`, "POST", { ...body, id: newEntryId() });
    await mutate(setupKeys.fields(farmId));
    setMessage({ tone: "success", text: `${field.name} saved: ${field.areaHa.toFixed(2)} ha.` });
    setSelectedId(field.id);
    setEditing(null);
    reset();
  }

  return (
    <section aria-labelledby="fields-heading" className="flex flex-col gap-3 rounded-2xl bg-white p-4 shadow-sm ring-1 ring-river-100">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="fields-heading" className="text-xl font-bold">
          Fields and outlines
        </h2>
        <Button
          variant="secondary"
          onClick={() => {
            setSelectedId(null);
            setEditing(null);
            setShape(null);
            setMode("draw");
          }}
        >
          Draw a new field
        </Button>
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      <BoundaryMap
        fields={fields}
        selectedId={selectedId}
        mode={mode}
        centre={centre}
        tileUrl={tileUrl}
        pending={shape}
        onSelect={(id) => {
          if (mode !== "view") return;
          setSelectedId(id);
          setEditing(null);
        }}
        onShape={setShape}
      />
      {mode === "draw" && !shape && <p className="font-bold">Tap the corners of the field on the map, then tap the first corner again to close the outline.</p>}
      {mode === "edit" && !shape && <p className="font-bold">Drag the corners of {selected?.name}; drag a middle marker to add a corner.</p>}
      {shape && !editing && (
        <div className="flex flex-wrap items-center gap-2 rounded-xl bg-paper p-3 ring-1 ring-river-100">
          <p className="flex-1" data-testid="pending-area">
            New outline: about {shapeHa?.toFixed(2)} ha (the saved area is computed on the server).
          </p>
          <Button onClick={() => void saveOutline()}>{selected ? "Save outline" : "Next: name the field"}</Button>
          <Button variant="quiet" onClick={reset}>
            Discard
          </Button>
        </div>
      )}
      <label htmlFor="field-pick" className="text-sm font-bold">
        Field
      </label>
      <select
        id="field-pick"
        className="tap rounded-xl border border-river-300 bg-white px-3 py-2"
        value={selectedId ?? ""}
        onChange={(e) => {
          setSelectedId(e.target.value || null);
          setEditing(null);
          reset();
        }}
      >
        <option value="">Choose a field (or tap it on the map)</option>
        {fields.map((f) => (
          <option key={f.id} value={f.id}>
            {f.name}
          </option>
        ))}
      </select>
      {selected && !editing && (
        <div className="flex flex-col gap-2">
          <p className="text-lg" data-testid="field-area">
            <strong>{selected.name}</strong>: {selected.areaHa.toFixed(2)} ha{selected.boundary ? "" : " (typed, no outline)"}
          </p>
          <div className="flex flex-wrap gap-2">
            {selected.boundary && (
              <Button variant="secondary" onClick={() => setMode(mode === "edit" ? "view" : "edit")}>
                {mode === "edit" ? "Stop editing corners" : "Edit corners"}
              </Button>
            )}
            <Button variant="secondary" onClick={() => setMode("draw")}>
              Redraw outline
            </Button>
            <Button variant="secondary" onClick={() => setEditing({ what: "field", field: selected })}>
              Name, soil, system, gauge
            </Button>
          </div>
        </div>
      )}
      {editing && (
        <FieldForm
          key={editing.field?.id ?? "new"}
          field={editing.field}
          boundary={editing.field ? null : shape}
          choices={choices}
          onSave={saveField}
          onCancel={() => {
            setEditing(null);
            reset();
          }}
        />
      )}
    </section>
  );
}
