"use client";

import { useEffect, useRef, useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import type { GaugeDto } from "@/lib/client/use-farm-setup";
import type { NewEntry } from "@/lib/client/use-log-queue";
import { farmClockInput, farmClockToInstant, nearest } from "@/lib/offline/log-defaults";
import { ChoiceButtons } from "./choice-buttons";
import { numberOrUndefined } from "./select-field";

const lastGaugeKey = (farmId: string) => `rootbank:last-gauge:${farmId}`;

/** The gauge to offer first: the nearest one when the phone may say where it is, else the last one read. */
function useDefaultGauge(farmId: string, gauges: GaugeDto[], setGauge: (id: string) => void): string | null {
  const [how, setHow] = useState<string | null>(null);
  // Defaults are chosen once per page; later list refreshes must not move the worker's choice.
  const initial = useRef({ gauges, setGauge });
  useEffect(() => {
    const { gauges, setGauge } = initial.current;
    const last = window.localStorage.getItem(lastGaugeKey(farmId));
    const lastGauge = gauges.find((g) => g.id === last) ?? gauges[0];
    if (lastGauge) {
      setGauge(lastGauge.id);
      setHow(last === lastGauge.id ? "the gauge you read last" : null);
    }
    if (!("geolocation" in navigator) || !gauges.some((g) => g.latitude !== null)) return;
    navigator.geolocation.getCurrentPosition(
      (pos) => {
        const near = nearest(gauges, pos.coords.latitude, pos.coords.longitude);
        if (near) {
          setGauge(near.id);
          setHow("the gauge nearest to you");
        }
      },
      () => undefined,
      { timeout: 8_000, maximumAge: 60_000 },
    );
  }, [farmId]);
  return how;
}

export function RainForm({ farmId, timeZone, gauges, onLog }: { farmId: string; timeZone: string; gauges: GaugeDto[]; onLog: (e: NewEntry) => Promise<void> }) {
  const [gaugeId, setGaugeId] = useState("");
  const [readAt, setReadAt] = useState(() => farmClockInput(timeZone));
  const [depth, setDepth] = useState("");
  const [trace, setTrace] = useState(false);
  const [photo, setPhoto] = useState<File | null>(null);
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const how = useDefaultGauge(farmId, gauges, setGaugeId);

  async function submit(ev: FormEvent) {
    ev.preventDefault();
    const depthMm = numberOrUndefined(depth);
    const at = farmClockToInstant(readAt, timeZone);
    const found: Record<string, string> = {};
    if (!gaugeId) found.gaugeId = "Choose the gauge you read";
    if (!at) found.readAt = "Give the date and time you read the gauge";
    if (!trace && depthMm === undefined) found.depthMm = "Give the depth in mm, or tick trace";
    if (depthMm !== undefined && Number.isNaN(depthMm)) found.depthMm = "The depth is a number of mm, e.g. 12.5";
    setErrors(found);
    if (Object.keys(found).length > 0 || !at) return;
    const gauge = gauges.find((g) => g.id === gaugeId);
    setBusy(true);
    try {
      window.localStorage.setItem(lastGaugeKey(farmId), gaugeId);
      await onLog({
        kind: "rain",
        body: { gaugeId, readAt: at, ...(trace ? { trace: true } : { depthMm: depthMm ?? 0 }), ...(note.trim() ? { note: note.trim() } : {}) },
        photo,
        summary: `Rain at ${gauge?.name ?? "gauge"}: ${trace ? "trace" : `${depthMm} mm`} (${readAt.replace("T", " ")})`,
      });
      setDepth("");
      setTrace(false);
      setPhoto(null);
      setNote("");
      setReadAt(farmClockInput(timeZone));
    } finally {
      setBusy(false);
    }
  }

  if (gauges.length === 0) return <p>This farm has no gauges read by hand. A farm manager adds them under Set-up; recording gauges send their own records.</p>;
  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate aria-label="Rain reading">
      <ChoiceButtons
        legend="Gauge"
        name="gaugeId"
        value={gaugeId}
        onChange={setGaugeId}
        options={gauges.map((g) => ({ value: g.id, label: g.name }))}
      />
      {how && <p className="-mt-2 text-sm text-ink/70">Chosen for you: {how}.</p>}
      {errors.gaugeId && <p className="text-sm font-bold text-clay-700">{errors.gaugeId}</p>}
      <TextField id="rain-read-at" label={`Read at (farm time, ${timeZone})`} type="datetime-local" value={readAt} onChange={(e) => setReadAt(e.target.value)} error={errors.readAt} />
      <div className="grid grid-cols-[1fr_auto] items-end gap-3">
        <TextField
          id="rain-depth"
          label="Rain (mm)"
          inputMode="decimal"
          value={depth}
          disabled={trace}
          onChange={(e) => setDepth(e.target.value)}
          error={errors.depthMm}
          placeholder={trace ? "trace" : "e.g. 12.5"}
        />
        <label className="tap flex items-center gap-2 rounded-xl px-3 ring-1 ring-river-300">
          <input type="checkbox" checked={trace} onChange={(e) => setTrace(e.target.checked)} className="h-6 w-6" />
          <span className="font-bold">Trace</span>
        </label>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="rain-photo" className="text-sm font-bold">
          Photo of the gauge (optional)
        </label>
        <input
          id="rain-photo"
          type="file"
          accept="image/*"
          capture="environment"
          onChange={(e) => setPhoto(e.target.files?.[0] ?? null)}
          className="tap rounded-xl border border-river-300 bg-white px-3 py-2 file:mr-3 file:rounded-lg file:border-0 file:bg-river-50 file:px-3 file:py-2 file:font-bold file:text-river-900"
        />
      </div>
      <TextField id="rain-note" label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} />
      <Button type="submit" disabled={busy} className="w-full text-lg">
        Save rain reading
      </Button>
    </form>
  );
}
