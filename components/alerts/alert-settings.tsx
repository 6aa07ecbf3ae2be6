"use client";

import { useState } from "react";
import { useSWRConfig } from "swr";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { ApiError, sendJson } from "@/lib/client/fetcher";
import { ALERT_KIND_INFO, type AlertRule } from "@/lib/alerts/rules";
import { useAlertPreferences, type AlertPreferencesDto, type AlertSettingsDto } from "@/lib/client/use-alerts";

/** One person's rules on this farm: what they hear about, how, and when not to be disturbed. */
export function AlertSettings({ farmId }: { farmId: string }) {
  const { data, error } = useAlertPreferences(farmId);
  if (error) return <Notice tone="problem">{(error as Error).message}</Notice>;
  if (!data) return <p className="text-ink/70">Loading your alert rules…</p>;
  return <AlertSettingsForm farmId={farmId} initial={data} />;
}

function AlertSettingsForm({ farmId, initial }: { farmId: string; initial: AlertPreferencesDto }) {
  const { mutate } = useSWRConfig();
  const [rules, setRules] = useState<AlertRule[]>(initial.rules);
  const [settings, setSettings] = useState<AlertSettingsDto>(initial.settings);
  const [quiet, setQuiet] = useState(initial.settings.quietStart !== null);
  const [status, setStatus] = useState<{ tone: "success" | "problem"; text: string } | null>(null);

  const change = (i: number, patch: Partial<AlertRule>) => setRules((rs) => rs.map((r, k) => (k === i ? { ...r, ...patch } : r)));

  async function save() {
    setStatus(null);
    const body = {
      rules,
      settings: { ...settings, quietStart: quiet ? (settings.quietStart ?? "21:00") : null, quietEnd: quiet ? (settings.quietEnd ?? "06:00") : null },
    };
    try {
      const saved = await sendJson<AlertPreferencesDto>(`/api/v1/farms/${farmId}/alerts`, "PUT", body);
      await mutate(`/api/v1/farms/${farmId}/alerts`, saved, { revalidate: false });
      setStatus({ tone: "success", text: "Saved." });
    } catch (err) {
      const fields = err instanceof ApiError ? Object.values(err.fields).join(" ") : "";
      setStatus({ tone: "problem", text: `${(err as Error).message} ${fields}`.trim() });
    }
  }

  return (
    <form
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-2 text-lg font-bold">What to tell me about</legend>
        {rules.map((r, i) => {
          const info = ALERT_KIND_INFO[r.kind];
          const id = `rule-${r.kind}`;
          return (
            <div key={r.kind} className="rounded-xl bg-white p-3 ring-1 ring-river-100">
              <label className="tap flex items-center gap-3 font-bold" htmlFor={id}>
                <input id={id} type="checkbox" className="h-6 w-6 accent-river-700" checked={r.enabled} onChange={(e) => change(i, { enabled: e.target.checked })} />
                {info.label}
              </label>
              <p className="text-sm text-ink/80">{info.help}</p>
              {r.enabled && (
                <div className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1">
                  {info.unit && (
                    <label className="flex items-center gap-2">
                      <span>Threshold</span>
                      <input
                        type="number"
                        min={info.min}
                        max={info.max}
                        step={1}
                        value={r.threshold ?? ""}
                        onChange={(e) => change(i, { threshold: e.target.value === "" ? null : Number(e.target.value) })}
                        className="tap w-24 rounded-lg border border-river-300 px-2"
                      />
                      <span>{info.unit}</span>
                    </label>
                  )}
                  <label className="tap flex items-center gap-2">
                    <input type="checkbox" className="h-5 w-5 accent-river-700" checked={r.push} onChange={(e) => change(i, { push: e.target.checked })} />
                    Push
                  </label>
                  <label className="tap flex items-center gap-2">
                    <input type="checkbox" className="h-5 w-5 accent-river-700" checked={r.email} onChange={(e) => change(i, { email: e.target.checked })} />
                    E-mail
                  </label>
                </div>
              )}
            </div>
          );
        })}
      </fieldset>

      <fieldset className="flex flex-col gap-2 rounded-xl bg-white p-3 ring-1 ring-river-100">
        <legend className="text-lg font-bold">When not to disturb me</legend>
        <label className="tap flex items-center gap-3">
          <input type="checkbox" className="h-6 w-6 accent-river-700" checked={quiet} onChange={(e) => setQuiet(e.target.checked)} />
          Quiet hours (farm time): pushes and e-mails wait until they end
        </label>
        {quiet && (
          <div className="flex flex-wrap gap-4">
            <label className="flex items-center gap-2">
              From
              <input type="time" className="tap rounded-lg border border-river-300 px-2" value={settings.quietStart ?? "21:00"} onChange={(e) => setSettings({ ...settings, quietStart: e.target.value })} />
            </label>
            <label className="flex items-center gap-2">
              to
              <input type="time" className="tap rounded-lg border border-river-300 px-2" value={settings.quietEnd ?? "06:00"} onChange={(e) => setSettings({ ...settings, quietEnd: e.target.value })} />
            </label>
          </div>
        )}
        <label className="tap flex items-center gap-3">
          <input type="checkbox" className="h-6 w-6 accent-river-700" checked={settings.digestOnly} onChange={(e) => setSettings({ ...settings, digestOnly: e.target.checked })} />
          Digest only: one e-mail a day instead of pushes and single e-mails
        </label>
        {settings.digestOnly && (
          <label className="flex items-center gap-2">
            Digest at
            <select className="tap rounded-lg border border-river-300 px-2" value={settings.digestHour} onChange={(e) => setSettings({ ...settings, digestHour: Number(e.target.value) })}>
              {Array.from({ length: 24 }, (_, h) => (
                <option key={h} value={h}>{`${String(h).padStart(2, "0")}:00`}</option>
              ))}
            </select>
          </label>
        )}
      </fieldset>
      <Button type="submit">Save my alert rules</Button>
      {status && <Notice tone={status.tone}>{status.text}</Notice>}
    </form>
  );
}
