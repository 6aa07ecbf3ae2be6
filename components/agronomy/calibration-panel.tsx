"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { useCalibration } from "@/lib/client/use-agronomy";
import { formatLocalDate } from "@/lib/units";
import { mm } from "./format";
import { TuningCaution } from "./tuning-caution";

/**
 * The planting's soil checks beside the depletion the account carried into each check's day, the error
 * statistics, and a suggested Kc scale the agronomist may accept (with a reason) or ignore.
 */
export function CalibrationPanel({
  farmId,
  plantingId,
  onSaved,
}: {
  farmId: string;
  plantingId: string;
  onSaved: () => void;
}) {
  const { data, error, isLoading, mutate } = useCalibration(farmId, plantingId);
  const [reason, setReason] = useState("");
  const [message, setMessage] = useState<{ tone: "success" | "problem"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const s = data?.suggestion;

  async function accept() {
    if (!s?.scale) return;
    setBusy(true);
    setMessage(null);
    try {
      await sendJson(`/api/v1/farms/${farmId}/plantings/${plantingId}/calibration`, "POST", {
        kcScale: s.scale,
        reason,
      });
      setReason("");
      setMessage({
        tone: "success",
        text: `Kc scale ${s.scale.toFixed(2)} stored. The account is being recomputed from the planting date.`,
      });
      onSaved();
      void mutate();
    } catch (err) {
      setMessage({
        tone: "problem",
        text: err instanceof ApiError ? err.message : "Could not save; try again.",
      });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section aria-labelledby="calibration-heading" className="flex flex-col gap-3">
      <h2 id="calibration-heading" className="text-xl font-bold">
        Calibration from soil checks
      </h2>
      {isLoading && <p className="text-ink/70">Comparing the checks with the account…</p>}
      {error && <Notice tone="problem">{error.message}</Notice>}
      {data && data.checks.length === 0 && (
        <p className="text-ink/70">No soil checks fall in this planting&apos;s account yet.</p>
      )}
      {data && data.checks.length > 0 && (
        <>
          <div className="overflow-x-auto">
            <table className="w-full text-sm">
              <caption className="text-left text-ink/80">
                Measured depletion against the depletion the account carried into the day (before the check
                reset it).
              </caption>
              <thead>
                <tr className="text-left">
                  <th scope="col" className="p-2">
                    Date
                  </th>
                  <th scope="col" className="p-2">
                    Check
                  </th>
                  <th scope="col" className="p-2">
                    Account
                  </th>
                  <th scope="col" className="p-2">
                    Error
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.checks.map((c) => (
                  <tr key={c.id} className="border-t border-river-100">
                    <td className="p-2">{formatLocalDate(c.date)}</td>
                    <td className="p-2">
                      {mm(c.observedMm)}{" "}
                      <span className="text-ink/70">
                        ({c.method}
                        {c.resetsAccount ? "" : ", not reset"})
                      </span>
                    </td>
                    <td className="p-2">{mm(c.modelledMm)}</td>
                    <td className="p-2">{`${c.errorMm >= 0 ? "+" : ""}${c.errorMm.toFixed(1)} mm`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <dl className="grid grid-cols-2 gap-2 rounded-xl bg-river-50 p-3 text-sm sm:grid-cols-4">
            <div>
              <dt className="font-bold">Checks (n)</dt>
              <dd>{data.stats.n}</dd>
            </div>
            <div>
              <dt className="font-bold">Mean error (bias)</dt>
              <dd>{mm(data.stats.meanErrorMm)}</dd>
            </div>
            <div>
              <dt className="font-bold">RMSE</dt>
              <dd>{mm(data.stats.rmseMm)}</dd>
            </div>
            <div>
              <dt className="font-bold">MAE</dt>
              <dd>{mm(data.stats.maeMm)}</dd>
            </div>
          </dl>
          <p className="text-xs text-ink/70">
            Error = account − check: positive means the account runs drier than the field.
          </p>
          {s?.scale == null ? (
            <p className="text-ink/70">At least three checks are needed before a Kc scale is suggested.</p>
          ) : (
            <div className="flex flex-col gap-2 rounded-xl p-3 ring-1 ring-river-100">
              <p>
                Suggested Kc scale <strong data-testid="suggested-scale">{s.scale.toFixed(2)}</strong> (now{" "}
                {data.kcScale.toFixed(2)}); with it the RMSE would be {mm(s.withScale?.rmseMm)}. Found by
                least squares over the checks, re-running the account ({s.evaluations} runs).
              </p>
              <TuningCaution />
              <label htmlFor="calibration-reason" className="text-sm font-bold">
                Why accept it? (required; kept in the history)
              </label>
              <textarea
                id="calibration-reason"
                rows={2}
                value={reason}
                onChange={(e) => setReason(e.target.value)}
                className="rounded-xl border border-river-300 bg-white px-3 py-2 text-base"
              />
              <div>
                <Button
                  type="button"
                  disabled={busy || reason.trim().length < 3 || s.scale === data.kcScale}
                  onClick={() => void accept()}
                >
                  Accept Kc × {s.scale.toFixed(2)}
                </Button>
              </div>
            </div>
          )}
        </>
      )}
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
    </section>
  );
}
