"use client";

import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import type { FieldDto, SystemDto } from "@/lib/client/use-farm-setup";
import type { NewEntry } from "@/lib/client/use-log-queue";
import { farmClockInput, farmClockToInstant } from "@/lib/offline/log-defaults";
import { ChoiceButtons } from "./choice-buttons";
import { numberOrUndefined, SelectField } from "./select-field";

type HowMuch = "hours" | "meter" | "depth";

const HOW_MUCH: { value: HowMuch; label: string; hint: string }[] = [
  { value: "hours", label: "Run hours", hint: "from start and end, or typed" },
  { value: "meter", label: "Meter", hint: "readings in m³" },
  { value: "depth", label: "Depth", hint: "gross mm applied" },
];

/** Hours between two instants, to the hundredth; null unless the end is after the start. */
function runHours(startIso: string | null, endIso: string | null): number | null {
  if (!startIso || !endIso) return null;
  const ms = Date.parse(endIso) - Date.parse(startIso);
  return ms > 0 ? Math.round((ms / 3_600_000) * 100) / 100 : null;
}

export function IrrigationForm({
  timeZone,
  fields,
  systems,
  onLog,
}: {
  timeZone: string;
  fields: FieldDto[];
  systems: SystemDto[];
  onLog: (e: NewEntry) => Promise<void>;
}) {
  const [fieldId, setFieldId] = useState(fields[0]?.id ?? "");
  const [systemId, setSystemId] = useState("");
  const [start, setStart] = useState(() => farmClockInput(timeZone));
  const [end, setEnd] = useState("");
  const [howMuch, setHowMuch] = useState<HowMuch>("hours");
  const [hours, setHours] = useState("");
  const [meterStart, setMeterStart] = useState("");
  const [meterEnd, setMeterEnd] = useState("");
  const [depth, setDepth] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);

  const field = fields.find((f) => f.id === fieldId);
  const ownSystem = systems.find((s) => s.id === field?.irrigationSystemId);
  const startIso = farmClockToInstant(start, timeZone);
  const endIso = end ? farmClockToInstant(end, timeZone) : null;
  const fromTimes = runHours(startIso, endIso);

  async function submit(ev: FormEvent) {
    ev.preventDefault();
    const found: Record<string, string> = {};
    const quantities: Record<string, number> = {};
    const num = (key: string, text: string, what: string) => {
      const v = numberOrUndefined(text);
      if (v === undefined || Number.isNaN(v)) found[key] = `Give ${what}`;
      else quantities[key] = v;
    };
    if (!fieldId) found.fieldId = "Choose the field";
    if (!startIso) found.startedAt = "Give the start date and time";
    if (end && !endIso) found.endedAt = "Give the end as a date and time, or leave it empty";
    if (howMuch === "hours") {
      if (hours.trim() === "" && fromTimes !== null) quantities.hours = fromTimes;
      else num("hours", hours, "the hours it ran, or the start and end");
    }
    if (howMuch === "meter") {
      num("meterStart", meterStart, "the meter at the start");
      num("meterEnd", meterEnd, "the meter at the end");
    }
    if (howMuch === "depth") num("grossDepthMm", depth, "the gross depth in mm");
    setErrors(found);
    if (Object.keys(found).length > 0 || !startIso) return;
    const method = howMuch === "depth" ? "depth" : howMuch;
    const amount =
      howMuch === "hours" ? `${quantities.hours} h` : howMuch === "meter" ? `${(quantities.meterEnd ?? 0) - (quantities.meterStart ?? 0)} m³ metered` : `${quantities.grossDepthMm} mm`;
    setBusy(true);
    try {
      await onLog({
        kind: "irrigation",
        body: { fieldId, startedAt: startIso, method, ...(endIso ? { endedAt: endIso } : {}), ...(systemId ? { systemId } : {}), ...quantities },
        summary: `Irrigation on ${field?.name ?? "field"}: ${amount} (from ${start.replace("T", " ")})`,
      });
      setHours("");
      setMeterStart(meterEnd);
      setMeterEnd("");
      setDepth("");
      setEnd("");
    } finally {
      setBusy(false);
    }
  }

  if (fields.length === 0) return <p>This farm has no fields yet. A farm manager adds them under Set-up.</p>;
  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate aria-label="Irrigation">
      <SelectField id="irr-field" label="Field" value={fieldId} onChange={(e) => setFieldId(e.target.value)} options={fields.map((f) => ({ value: f.id, label: f.name }))} error={errors.fieldId} />
      <SelectField
        id="irr-system"
        label="Irrigation system"
        value={systemId}
        onChange={(e) => setSystemId(e.target.value)}
        options={[{ value: "", label: ownSystem ? `The field's own: ${ownSystem.name}` : "The field's own system" }, ...systems.map((s) => ({ value: s.id, label: s.name }))]}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField id="irr-start" label={`Started (farm time, ${timeZone})`} type="datetime-local" value={start} onChange={(e) => setStart(e.target.value)} error={errors.startedAt} />
        <TextField id="irr-end" label="Ended (optional)" type="datetime-local" value={end} onChange={(e) => setEnd(e.target.value)} error={errors.endedAt} />
      </div>
      <ChoiceButtons legend="How much water" name="howMuch" value={howMuch} onChange={setHowMuch} options={HOW_MUCH} />
      {howMuch === "hours" && (
        <TextField
          id="irr-hours"
          label="Run hours"
          inputMode="decimal"
          value={hours}
          onChange={(e) => setHours(e.target.value)}
          placeholder={fromTimes !== null ? `${fromTimes} from start and end` : "e.g. 8"}
          hint="The volume follows from the system's flow rate."
          error={errors.hours}
        />
      )}
      {howMuch === "meter" && (
        <div className="grid grid-cols-2 gap-3">
          <TextField id="irr-meter-start" label="Meter at start (m³)" inputMode="decimal" value={meterStart} onChange={(e) => setMeterStart(e.target.value)} error={errors.meterStart} />
          <TextField id="irr-meter-end" label="Meter at end (m³)" inputMode="decimal" value={meterEnd} onChange={(e) => setMeterEnd(e.target.value)} error={errors.meterEnd} />
        </div>
      )}
      {howMuch === "depth" && (
        <TextField id="irr-depth" label="Gross depth (mm)" inputMode="decimal" value={depth} onChange={(e) => setDepth(e.target.value)} error={errors.grossDepthMm} />
      )}
      <Button type="submit" disabled={busy} className="w-full text-lg">
        Save irrigation
      </Button>
    </form>
  );
}
