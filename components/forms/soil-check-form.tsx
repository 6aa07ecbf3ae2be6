"use client";

import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import type { FieldDto } from "@/lib/client/use-farm-setup";
import type { NewEntry } from "@/lib/client/use-log-queue";
import { farmClockInput, farmClockToInstant } from "@/lib/offline/log-defaults";
import { ChoiceButtons } from "./choice-buttons";
import { numberOrUndefined, SelectField } from "./select-field";

type Method = "probe" | "feel" | "sensor" | "gravimetric";

const METHODS: { value: Method; label: string; hint: string }[] = [
  { value: "feel", label: "Feel", hint: "hand estimate" },
  { value: "probe", label: "Probe", hint: "push probe or auger" },
  { value: "sensor", label: "Sensor", hint: "moisture sensor" },
  { value: "gravimetric", label: "Oven-dried", hint: "gravimetric sample" },
];

export function SoilCheckForm({ timeZone, fields, onLog }: { timeZone: string; fields: FieldDto[]; onLog: (e: NewEntry) => Promise<void> }) {
  const [fieldId, setFieldId] = useState(fields[0]?.id ?? "");
  const [checkedAt, setCheckedAt] = useState(() => farmClockInput(timeZone));
  const [method, setMethod] = useState<Method>("feel");
  const [depthM, setDepthM] = useState("0.3");
  const [depletion, setDepletion] = useState("");
  const [resets, setResets] = useState(true);
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);

  async function submit(ev: FormEvent) {
    ev.preventDefault();
    const at = farmClockToInstant(checkedAt, timeZone);
    const depletionMm = numberOrUndefined(depletion);
    const depth = numberOrUndefined(depthM);
    const found: Record<string, string> = {};
    if (!fieldId) found.fieldId = "Choose the field";
    if (!at) found.checkedAt = "Give the date and time of the check";
    if (depletionMm === undefined || Number.isNaN(depletionMm)) found.depletionMm = "Give the depletion in mm (0 at field capacity)";
    if (depth !== undefined && Number.isNaN(depth)) found.depthM = "The depth is a number of metres, e.g. 0.3";
    setErrors(found);
    if (Object.keys(found).length > 0 || !at || depletionMm === undefined) return;
    const field = fields.find((f) => f.id === fieldId);
    setBusy(true);
    try {
      await onLog({
        kind: "soil",
        body: { fieldId, checkedAt: at, method, depletionMm, resetsAccount: resets, ...(depth !== undefined ? { depthM: depth } : {}), ...(note.trim() ? { note: note.trim() } : {}) },
        summary: `Soil check on ${field?.name ?? "field"}: depletion ${depletionMm} mm by ${method} (${checkedAt.replace("T", " ")})`,
      });
      setDepletion("");
      setNote("");
    } finally {
      setBusy(false);
    }
  }

  if (fields.length === 0) return <p>This farm has no fields yet. A farm manager adds them under Set-up.</p>;
  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate aria-label="Soil check">
      <SelectField id="soil-field" label="Field" value={fieldId} onChange={(e) => setFieldId(e.target.value)} options={fields.map((f) => ({ value: f.id, label: f.name }))} error={errors.fieldId} />
      <TextField id="soil-at" label={`Checked at (farm time, ${timeZone})`} type="datetime-local" value={checkedAt} onChange={(e) => setCheckedAt(e.target.value)} error={errors.checkedAt} />
      <ChoiceButtons legend="Method" name="method" value={method} onChange={setMethod} options={METHODS} />
      <div className="grid grid-cols-2 gap-3">
        <TextField id="soil-depth" label="Depth checked (m)" inputMode="decimal" value={depthM} onChange={(e) => setDepthM(e.target.value)} error={errors.depthM} />
        <TextField
          id="soil-depletion"
          label="Depletion (mm)"
          inputMode="decimal"
          value={depletion}
          onChange={(e) => setDepletion(e.target.value)}
          hint="Water missing below field capacity"
          error={errors.depletionMm}
        />
      </div>
      <label className="tap flex items-center gap-3 rounded-xl px-3 ring-1 ring-river-300">
        <input type="checkbox" checked={resets} onChange={(e) => setResets(e.target.checked)} className="h-6 w-6" />
        <span>Set the field&apos;s water account to this depletion</span>
      </label>
      <TextField id="soil-note" label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} />
      <Button type="submit" disabled={busy} className="w-full text-lg">
        Save soil check
      </Button>
    </form>
  );
}
