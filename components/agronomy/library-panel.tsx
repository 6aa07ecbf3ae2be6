"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { cropValueSources, soilValueSources } from "@/lib/agronomy/sources";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { useCrops, useSoils, type CropDto, type SoilDto } from "@/lib/client/use-agronomy";
import { CURVE_NUMBER_KEYS, label, show } from "./format";
import { HistoryPanel } from "./history-panel";

const CROP_KEYS = [
  "kcIni",
  "kcMid",
  "kcEnd",
  "kcbIni",
  "kcbMid",
  "kcbEnd",
  "stageIniDays",
  "stageDevDays",
  "stageMidDays",
  "stageLateDays",
  "heightM",
  "rootMinM",
  "rootMaxM",
  "p",
] as const;
const SOIL_KEYS = [
  "thetaFc",
  "thetaWp",
  "thetaSat",
  "rewMm",
  "tewMm",
  "gaSuctionMm",
  "gaKsatMmH",
  "gaPorosity",
  "gaEffectivePorosity",
  "hydrologicGroup",
] as const;
const SOIL_EDIT = ["thetaFc", "thetaWp", "thetaSat", "rewMm", "tewMm"] as const;

type Kind = "crops" | "soils";
type Row = (CropDto | SoilDto) & Record<string, unknown>;

/** A value table: each value with where it comes from (the engine's library tables, or the row's own source). */
function Values({
  row,
  keys,
  sources,
}: {
  row: Row;
  keys: readonly string[];
  sources: Record<string, string> | null;
}) {
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-2">
      {keys.map((k) => (
        <div key={k} className="flex flex-col border-b border-river-100 py-1">
          <dt className="font-bold">
            {label(k)}: <span className="font-normal">{show(row[k])}</span>
          </dt>
          <dd className="text-xs text-ink/70">
            {row.library ? (sources?.[k] ?? row.source ?? "source not recorded") : "farm value"}
          </dd>
        </div>
      ))}
    </dl>
  );
}

function EditForm({
  farmId,
  kind,
  row,
  keys,
  onDone,
}: {
  farmId: string;
  kind: Kind;
  row: Row;
  keys: readonly string[];
  onDone: () => void;
}) {
  const [values, setValues] = useState<Record<string, string>>(
    Object.fromEntries(keys.map((k) => [k, row[k] === null ? "" : String(row[k])])),
  );
  const [reason, setReason] = useState("");
  const [error, setError] = useState<ApiError | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const patch = {
      ...Object.fromEntries(keys.map((k) => [k, values[k]!.trim() === "" ? null : Number(values[k])])),
      reason,
    };
    try {
      await sendJson(`/api/v1/farms/${farmId}/${kind}/${row.id}`, "PATCH", patch);
      onDone();
    } catch (err) {
      setError(err instanceof ApiError ? err : new ApiError(0, "network", "Could not save; try again."));
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={(e) => void submit(e)} className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        {keys.map((k) => (
          <div key={k} className="flex flex-col gap-1">
            <label htmlFor={`${row.id}-${k}`} className="text-sm font-bold">
              {label(k)}
            </label>
            <input
              id={`${row.id}-${k}`}
              type="number"
              step="any"
              inputMode="decimal"
              value={values[k]}
              onChange={(e) => setValues((v) => ({ ...v, [k]: e.target.value }))}
              aria-invalid={error?.fields[k] ? true : undefined}
              className="tap rounded-xl border border-river-300 bg-white px-3 py-2 text-base"
            />
            {error?.fields[k] && <p className="text-sm font-bold text-clay-700">{error.fields[k]}</p>}
          </div>
        ))}
      </div>
      <label htmlFor={`${row.id}-reason`} className="text-sm font-bold">
        Why this change? (required; kept in the history)
      </label>
      <input
        id={`${row.id}-reason`}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        aria-invalid={error?.fields.reason ? true : undefined}
        className="tap rounded-xl border border-river-300 bg-white px-3 py-2 text-base"
      />
      {error?.fields.reason && <p className="text-sm font-bold text-clay-700">{error.fields.reason}</p>}
      {error && <Notice tone="problem">{error.message}</Notice>}
      <p className="text-sm text-ink/70">
        Every planting of this {kind === "crops" ? "crop" : "soil"} is recomputed after a change. The values
        are estimates; confirm them in the field.
      </p>
      <div className="flex gap-2">
        <Button type="submit" disabled={busy || reason.trim().length < 3}>
          {busy ? "Saving…" : "Save"}
        </Button>
        <Button type="button" variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function Entry({
  farmId,
  kind,
  row,
  onChanged,
}: {
  farmId: string;
  kind: Kind;
  row: Row;
  onChanged: () => void;
}) {
  const [mode, setMode] = useState<"none" | "edit" | "history">("none");
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);
  const crop = kind === "crops";
  const sources = row.library
    ? crop
      ? cropValueSources(row.name)
      : soilValueSources(String(row.texture))
    : null;

  async function copy() {
    setMessage(null);
    for (const suffix of ["", " 2", " 3", " 4"]) {
      try {
        await sendJson(`/api/v1/farms/${farmId}/${kind}`, "POST", {
          fromLibraryId: row.id,
          name: `${row.name} (farm copy${suffix})`,
        });
        setMessage({
          tone: "success",
          text: `A farm copy of ${row.name} is listed under the farm's own ${crop ? "crops" : "soils"}.`,
        });
        onChanged();
        return;
      } catch (err) {
        if (!(err instanceof ApiError) || err.status !== 409) {
          setMessage({
            tone: "problem",
            text: err instanceof ApiError ? err.message : "Could not copy; try again.",
          });
          return;
        }
      }
    }
    setMessage({ tone: "problem", text: "This farm already has several copies; rename one first." });
  }

  return (
    <li className="rounded-xl bg-white p-3 ring-1 ring-river-100">
      <details>
        <summary className="tap flex cursor-pointer flex-wrap items-center gap-2">
          <span className="font-bold">{row.name}</span>
          <span
            className={`rounded-full px-2 text-xs ${row.library ? "bg-river-50 text-river-900" : "bg-reed-100 text-reed-700"}`}
          >
            {row.library ? "published default" : "farm copy"}
          </span>
          {crop ? (
            <span className="text-sm text-ink/80">
              Kc {show(row.kcIni)} / {show(row.kcMid)} / {show(row.kcEnd)}
            </span>
          ) : (
            <span className="text-sm text-ink/80">{String(row.texture)}</span>
          )}
        </summary>
        <div className="mt-2 flex flex-col gap-3">
          {mode === "edit" ? (
            <EditForm
              farmId={farmId}
              kind={kind}
              row={row}
              keys={crop ? CURVE_NUMBER_KEYS : SOIL_EDIT}
              onDone={() => {
                setMode("none");
                onChanged();
              }}
            />
          ) : (
            <Values row={row} keys={crop ? CROP_KEYS : SOIL_KEYS} sources={sources} />
          )}
          {row.library && row.source && <p className="text-xs text-ink/70">Row source: {row.source}</p>}
          {row.note && <p className="text-sm">{row.note}</p>}
          <div className="flex flex-wrap gap-2">
            {row.library ? (
              <Button type="button" variant="secondary" onClick={() => void copy()}>
                Make a farm copy
              </Button>
            ) : (
              <>
                <Button
                  type="button"
                  variant="secondary"
                  onClick={() => setMode(mode === "edit" ? "none" : "edit")}
                >
                  Edit
                </Button>
                <Button
                  type="button"
                  variant="quiet"
                  onClick={() => setMode(mode === "history" ? "none" : "history")}
                >
                  History
                </Button>
              </>
            )}
          </div>
          {mode === "history" && (
            <HistoryPanel farmId={farmId} kind={kind} id={row.id} title={`Changes to ${row.name}`} />
          )}
          {message && <Notice tone={message.tone}>{message.text}</Notice>}
        </div>
      </details>
    </li>
  );
}

/** The published soils and crops (read-only, each value naming its table) and the farm's own copies (editable). */
export function LibraryPanel({ farmId }: { farmId: string }) {
  const crops = useCrops(farmId);
  const soils = useSoils(farmId);
  const sections: {
    kind: Kind;
    title: string;
    rows: Row[] | undefined;
    error: Error | undefined;
    refresh: () => void;
  }[] = [
    {
      kind: "crops",
      title: "Crops",
      rows: crops.data?.data as Row[] | undefined,
      error: crops.error as Error | undefined,
      refresh: () => void crops.mutate(),
    },
    {
      kind: "soils",
      title: "Soils",
      rows: soils.data?.data as Row[] | undefined,
      error: soils.error as Error | undefined,
      refresh: () => void soils.mutate(),
    },
  ];
  return (
    <div className="flex flex-col gap-6">
      {sections.map((s) => (
        <section key={s.kind} aria-labelledby={`library-${s.kind}`} className="flex flex-col gap-2">
          <h2 id={`library-${s.kind}`} className="text-xl font-bold">
            {s.title}
          </h2>
          {s.error && <Notice tone="problem">{s.error.message}</Notice>}
          {!s.rows && !s.error && <p className="text-ink/70">Loading…</p>}
          {s.rows && (
            <>
              <h3 className="font-bold">This farm&apos;s own</h3>
              <ul className="flex flex-col gap-2">
                {s.rows
                  .filter((r) => !r.library)
                  .map((r) => (
                    <Entry key={r.id} farmId={farmId} kind={s.kind} row={r} onChanged={s.refresh} />
                  ))}
              </ul>
              <h3 className="font-bold">Published defaults (read-only)</h3>
              <ul className="flex flex-col gap-2">
                {s.rows
                  .filter((r) => r.library)
                  .map((r) => (
                    <Entry key={r.id} farmId={farmId} kind={s.kind} row={r} onChanged={s.refresh} />
                  ))}
              </ul>
            </>
          )}
        </section>
      ))}
    </div>
  );
}
