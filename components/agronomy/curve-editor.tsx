"use client";

import { useEffect, useMemo, useState } from "react";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { ApiError, fetchJson, sendJson } from "@/lib/client/fetcher";
import type { CropDto, CurvePreviewDto, PlantingDto } from "@/lib/client/use-agronomy";
import { CURVE_NUMBER_KEYS, label } from "./format";
import { KcCurveChart, type CurveValues } from "./kc-curve-chart";
import { PreviewChart } from "./preview-chart";
import { TuningCaution } from "./tuning-caution";

type NumberKey = (typeof CURVE_NUMBER_KEYS)[number];
type Form = Record<NumberKey | "mad" | "kcScale", string> & { climateAdjust: boolean };

const STEP: Record<NumberKey | "mad" | "kcScale", string> = {
  kcIni: "0.01",
  kcMid: "0.01",
  kcEnd: "0.01",
  stageIniDays: "1",
  stageDevDays: "1",
  stageMidDays: "1",
  stageLateDays: "1",
  rootMinM: "0.05",
  rootMaxM: "0.05",
  p: "0.01",
  mad: "0.01",
  kcScale: "0.01",
};

/** The values the account runs with: the planting's override, else the crop's. */
function effective(planting: PlantingDto, crop: CropDto): Form {
  const f = {} as Form;
  for (const k of CURVE_NUMBER_KEYS) f[k] = String(planting[k] ?? crop[k]);
  f.mad = planting.mad === null ? "" : String(planting.mad);
  f.kcScale = String(planting.kcScale ?? 1);
  f.climateAdjust = planting.climateAdjust;
  return f;
}

/** What differs from the saved values, as the API takes it. */
function editOf(form: Form, saved: Form): Record<string, number | boolean | null> {
  const edit: Record<string, number | boolean | null> = {};
  for (const k of [...CURVE_NUMBER_KEYS, "kcScale"] as const) {
    if (form[k].trim() !== "" && Number(form[k]) !== Number(saved[k])) edit[k] = Number(form[k]);
  }
  if (form.mad.trim() !== saved.mad.trim()) edit.mad = form.mad.trim() === "" ? null : Number(form.mad);
  if (form.climateAdjust !== saved.climateAdjust) edit.climateAdjust = form.climateAdjust;
  return edit;
}

function curveOf(f: Form): CurveValues {
  const n = (k: NumberKey) => (Number.isFinite(Number(f[k])) ? Number(f[k]) : 0);
  return {
    kcIni: n("kcIni"),
    kcMid: n("kcMid"),
    kcEnd: n("kcEnd"),
    stageIniDays: n("stageIniDays"),
    stageDevDays: n("stageDevDays"),
    stageMidDays: n("stageMidDays"),
    stageLateDays: n("stageLateDays"),
  };
}

/** Waits a little after the last keystroke or drag before asking for a new what-if. */
function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

/**
 * A planting's crop curve: number inputs (the primary way), the draggable Kc curve, the live what-if of
 * the season's account beside the saved one, and saving with a required reason.
 */
export function CurveEditor({
  farmId,
  planting,
  crop,
  onSaved,
}: {
  farmId: string;
  planting: PlantingDto;
  crop: CropDto;
  onSaved: () => void;
}) {
  const saved = useMemo(() => effective(planting, crop), [planting, crop]);
  const [form, setForm] = useState<Form>(saved);
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [recomputing, setRecomputing] = useState(false);
  useEffect(() => setForm(saved), [saved]);

  const edit = useMemo(() => editOf(form, saved), [form, saved]);
  const editKey = useSettled(JSON.stringify(edit), 350);
  const url = `/api/v1/farms/${farmId}/plantings/${planting.id}`;
  const preview = useSWR<CurvePreviewDto, ApiError>(
    [`${url}/preview`, editKey],
    ([u, body]: [string, string]) => sendJson<CurvePreviewDto>(u, "POST", JSON.parse(body)),
    {
      keepPreviousData: true,
      revalidateOnFocus: false,
    },
  );
  // After a save, follow the field's mark until the worker has rewritten the account. Polled directly,
  // not through SWR: a status cached by the map from before the save would say "not dirty" at once.
  const revalidatePreview = preview.mutate;
  useEffect(() => {
    if (!recomputing) return;
    let stopped = false;
    const look = async () => {
      try {
        const status = await fetchJson<{ data: { id: string; dirty: boolean }[] }>(
          `/api/v1/farms/${farmId}/status`,
        );
        if (stopped || status.data.find((f) => f.id === planting.fieldId)?.dirty !== false) return;
        stopped = true;
        setRecomputing(false);
        setMessage({
          tone: "success",
          text: "Saved. The field's water account has been recomputed with the new curve.",
        });
        void revalidatePreview();
      } catch {
        // a dropped connection: the next look tries again
      }
    };
    const timer = setInterval(() => void look(), 1500);
    void look();
    return () => {
      stopped = true;
      clearInterval(timer);
    };
  }, [recomputing, farmId, planting.fieldId, revalidatePreview]);

  const set = (k: keyof Form, v: string | boolean) => setForm((f) => ({ ...f, [k]: v }));
  const changed = Object.keys(edit).length > 0;

  async function save() {
    setBusy(true);
    setErrors({});
    setMessage(null);
    try {
      await sendJson(`${url}/curve`, "POST", { changes: edit, reason });
      setReason("");
      setRecomputing(true);
      setMessage({
        tone: "success",
        text: `Saved with your reason. The account is being recomputed from ${planting.plantingDate}…`,
      });
      onSaved();
    } catch (err) {
      if (err instanceof ApiError) {
        setErrors(
          Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [k.replace(/^changes\./, ""), v])),
        );
        setMessage({ tone: "problem", text: err.message });
      } else setMessage({ tone: "problem", text: "Could not save; check the connection and try again." });
    } finally {
      setBusy(false);
    }
  }

  const used = preview.data?.kcUsed;
  const input = (k: NumberKey | "mad" | "kcScale", hint?: string) => (
    <div key={k} className="flex flex-col gap-1">
      <label htmlFor={`curve-${k}`} className="text-sm font-bold">
        {label(k)}
      </label>
      <input
        id={`curve-${k}`}
        type="number"
        inputMode="decimal"
        step={STEP[k]}
        value={form[k]}
        onChange={(e) => set(k, e.target.value)}
        aria-invalid={errors[k] ? true : undefined}
        aria-describedby={errors[k] ? `curve-${k}-error` : hint ? `curve-${k}-hint` : undefined}
        className={`tap rounded-xl border bg-white px-3 py-2 text-base ${errors[k] ? "border-clay-500" : edit[k] !== undefined ? "border-river-700 ring-2 ring-river-100" : "border-river-300"}`}
      />
      {hint && !errors[k] && (
        <p id={`curve-${k}-hint`} className="text-xs text-ink/70">
          {hint}
        </p>
      )}
      {errors[k] && (
        <p id={`curve-${k}-error`} className="text-sm font-bold text-clay-700">
          {errors[k]}
        </p>
      )}
    </div>
  );
  const cropHint = (k: NumberKey) =>
    `${crop.name}: ${crop[k]}${planting[k] !== null ? " (this planting overrides it)" : ""}`;

  return (
    <section aria-labelledby="curve-heading" className="flex flex-col gap-4">
      <h2 id="curve-heading" className="text-xl font-bold">
        Crop curve
      </h2>
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.3fr)]">
        <div className="flex flex-col gap-3">
          <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <legend className="mb-1 text-sm font-bold text-ink/80">Crop coefficients</legend>
            {input("kcIni", cropHint("kcIni"))}
            {input("kcMid", cropHint("kcMid"))}
            {input("kcEnd", cropHint("kcEnd"))}
          </fieldset>
          <div className="flex flex-col gap-1 rounded-xl bg-river-50 p-3 text-sm" aria-live="polite">
            <dl className="grid grid-cols-2 gap-2">
              <div>
                <dt className="font-bold">Kc mid used</dt>
                <dd data-testid="kc-mid-used">
                  {used?.edited ? used.edited.mid.toFixed(2) : "…"}{" "}
                  <span className="text-ink/70">
                    (table {Number(form.kcMid).toFixed(2)}
                    {Number(form.kcScale) !== 1 ? ` × ${form.kcScale}` : ""})
                  </span>
                </dd>
              </div>
              <div>
                <dt className="font-bold">Kc end used</dt>
                <dd>
                  {used?.edited ? used.edited.end.toFixed(2) : "…"}{" "}
                  <span className="text-ink/70">(table {Number(form.kcEnd).toFixed(2)})</span>
                </dd>
              </div>
            </dl>
            <p className="text-xs text-ink/70">
              {!form.climateAdjust
                ? "Climate adjustment is off: the table values are used as they are."
                : used?.edited && !used.edited.adjusted
                  ? "No weather recorded yet for the mid and late stages, so the table values are used until it comes in (FAO-56 eq. 62 then adjusts them)."
                  : `Adjusted for this farm's wind and humidity in those stages (FAO-56 eq. 62${used?.edited?.midWindMs != null ? `: u2 ${used.edited.midWindMs.toFixed(1)} m/s, RHmin ${used.edited.midRhMinPct?.toFixed(0)} %` : ""}).`}
            </p>
          </div>
          <fieldset className="grid grid-cols-2 gap-3">
            <legend className="mb-1 text-sm font-bold text-ink/80">Stage lengths</legend>
            {input("stageIniDays", cropHint("stageIniDays"))}
            {input("stageDevDays", cropHint("stageDevDays"))}
            {input("stageMidDays", cropHint("stageMidDays"))}
            {input("stageLateDays", cropHint("stageLateDays"))}
          </fieldset>
          <fieldset className="grid grid-cols-2 gap-3">
            <legend className="mb-1 text-sm font-bold text-ink/80">Roots, stress and trigger</legend>
            {input("rootMinM", cropHint("rootMinM"))}
            {input("rootMaxM", cropHint("rootMaxM"))}
            {input("p", cropHint("p"))}
            {input("mad", "Empty: irrigate at RAW (p × TAW)")}
            {input("kcScale", "1 = the curve as given")}
            <label className="flex items-center gap-2 text-sm font-bold">
              <input
                type="checkbox"
                className="h-5 w-5"
                checked={form.climateAdjust}
                onChange={(e) => set("climateAdjust", e.target.checked)}
              />
              {label("climateAdjust")}
            </label>
          </fieldset>
        </div>
        <div className="flex min-w-0 flex-col gap-4">
          <KcCurveChart
            saved={curveOf(saved)}
            edited={curveOf(form)}
            onChange={(next) =>
              setForm((f) => ({
                ...f,
                ...Object.fromEntries(Object.entries(next).map(([k, v]) => [k, String(v)])),
              }))
            }
          />
          {preview.error && <Notice tone="problem">{preview.error.message}</Notice>}
          {preview.data && preview.data.saved.length === 0 && (
            <Notice>This planting has no account days yet, so there is nothing to compare.</Notice>
          )}
          {preview.data && preview.data.saved.length > 0 && (
            <>
              <PreviewChart saved={preview.data.saved} edited={preview.data.edited} />
              <p className="text-sm" data-testid="preview-summary">
                {changed ? "What-if: " : "No edits yet: "}
                depletion at the end {preview.data.saved.at(-1)!.depletionMm.toFixed(1)} mm saved,{" "}
                <strong>{preview.data.edited.at(-1)!.depletionMm.toFixed(1)} mm with your edits</strong>; days
                at or past the trigger {preview.data.daysAtOrPastTrigger.saved} saved,{" "}
                <strong>{preview.data.daysAtOrPastTrigger.edited} with your edits</strong>.
                {preview.isValidating ? " Updating…" : ""}
              </p>
            </>
          )}
        </div>
      </div>
      <TuningCaution />
      <div className="flex flex-col gap-2 rounded-xl p-3 ring-1 ring-river-100">
        <label htmlFor="curve-reason" className="text-sm font-bold">
          Why this change? (required; kept in the history)
        </label>
        <textarea
          id="curve-reason"
          rows={2}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={errors.reason ? true : undefined}
          aria-describedby={errors.reason ? "curve-reason-error" : undefined}
          className="rounded-xl border border-river-300 bg-white px-3 py-2 text-base"
        />
        {errors.reason && (
          <p id="curve-reason-error" className="text-sm font-bold text-clay-700">
            {errors.reason}
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <Button
            type="button"
            disabled={!changed || busy || reason.trim().length < 3}
            onClick={() => void save()}
          >
            {busy ? "Saving…" : "Save the curve"}
          </Button>
          <Button
            type="button"
            variant="secondary"
            disabled={!changed || busy}
            onClick={() => setForm(saved)}
          >
            Undo edits
          </Button>
        </div>
        {!changed && <p className="text-sm text-ink/70">Nothing is stored until you save with a reason.</p>}
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
    </section>
  );
}
