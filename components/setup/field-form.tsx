"use client";

import { useState, type FormEvent } from "react";
import { SelectField } from "@/components/forms/select-field";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { TextField } from "@/components/ui/text-field";
import { ApiError } from "@/lib/client/fetcher";
import type { FieldDto, GaugeDto, SoilDto, SystemDto } from "@/lib/client/use-farm-setup";
import type { Boundary } from "@/lib/geo/boundary";

export interface FieldChoices {
  soils: SoilDto[];
  systems: SystemDto[];
  gauges: GaugeDto[];
}

const none = (what: string) => ({ value: "", label: what });

/**
 * A field's name and what it is linked to: soil, irrigation system and its own rain gauge (without one,
 * rain comes from the nearest gauges). The area is typed only when there is no outline to compute it from.
 */
export function FieldForm({
  field,
  boundary,
  choices,
  onSave,
  onCancel,
}: {
  field: FieldDto | null;
  /** the outline the new field gets, drawn on the map */
  boundary: Boundary | null;
  choices: FieldChoices;
  onSave: (body: Record<string, unknown>) => Promise<void>;
  onCancel: () => void;
}) {
  const [name, setName] = useState(field?.name ?? "");
  const [soilId, setSoilId] = useState(field?.soilId ?? "");
  const [systemId, setSystemId] = useState(field?.irrigationSystemId ?? "");
  const [gaugeId, setGaugeId] = useState(field?.gaugeId ?? "");
  const [slope, setSlope] = useState(field?.slopePct === null || field?.slopePct === undefined ? "" : String(field.slopePct));
  const [area, setArea] = useState(field && !field.boundary ? String(field.areaHa) : "");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const hasOutline = Boolean(boundary ?? field?.boundary);

  async function submit(ev: FormEvent) {
    ev.preventDefault();
    const body: Record<string, unknown> = {
      name,
      soilId: soilId || null,
      irrigationSystemId: systemId || null,
      gaugeId: gaugeId || null,
      slopePct: slope.trim() === "" ? null : Number(slope.replace(",", ".")),
    };
    if (!field && boundary) body.boundary = boundary;
    if (!hasOutline && area.trim() !== "") body.areaHa = Number(area.replace(",", "."));
    setBusy(true);
    try {
      await onSave(body);
    } catch (err) {
      setErrors(err instanceof ApiError ? err.fields : {});
      setProblem(err instanceof Error ? err.message : "Could not save the field.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-label={field ? `Edit ${field.name}` : "New field"}>
      {problem && <Notice tone="problem">{problem}</Notice>}
      <TextField id="field-name" label="Field name" value={name} onChange={(e) => setName(e.target.value)} error={errors.name} />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          id="field-soil"
          label="Soil"
          value={soilId}
          onChange={(e) => setSoilId(e.target.value)}
          error={errors.soilId}
          options={[none("Not set"), ...choices.soils.map((s) => ({ value: s.id, label: s.library ? `${s.name} (library)` : s.name }))]}
        />
        <SelectField
          id="field-system"
          label="Irrigation system"
          value={systemId}
          onChange={(e) => setSystemId(e.target.value)}
          error={errors.irrigationSystemId}
          options={[none("None"), ...choices.systems.filter((s) => s.archivedAt === null).map((s) => ({ value: s.id, label: s.name }))]}
        />
        <SelectField
          id="field-gauge"
          label="Own rain gauge"
          value={gaugeId}
          onChange={(e) => setGaugeId(e.target.value)}
          error={errors.gaugeId}
          options={[none("None: use the nearest gauges"), ...choices.gauges.filter((g) => g.archivedAt === null).map((g) => ({ value: g.id, label: g.name }))]}
        />
        <TextField id="field-slope" label="Slope (%)" inputMode="decimal" value={slope} onChange={(e) => setSlope(e.target.value)} error={errors.slopePct} />
        {!hasOutline && (
          <TextField
            id="field-area"
            label="Area (ha)"
            inputMode="decimal"
            value={area}
            onChange={(e) => setArea(e.target.value)}
            hint="Only without an outline: an outline's area is computed"
            error={errors.areaHa ?? errors.boundary}
          />
        )}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={busy}>
          {field ? "Save field" : "Add field"}
        </Button>
        <Button type="button" variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
