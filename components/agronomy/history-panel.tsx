"use client";

import { useMemo, useState } from "react";
import { Notice } from "@/components/ui/notice";
import { changedKeys, compareVersions, versionsOf } from "@/lib/agronomy/versions";
import { useHistory } from "@/lib/client/use-agronomy";
import { label, show, when } from "./format";

const ORDER = [
  "kcIni",
  "kcMid",
  "kcEnd",
  "kcScale",
  "stageIniDays",
  "stageDevDays",
  "stageMidDays",
  "stageLateDays",
  "rootMinM",
  "rootMaxM",
  "p",
  "mad",
  "climateAdjust",
];

/**
 * Who changed a planting, farm crop or farm soil, when and why; pick two versions to see them side by
 * side with the changed values marked.
 */
export function HistoryPanel({
  farmId,
  kind,
  id,
  title,
}: {
  farmId: string;
  kind: "plantings" | "crops" | "soils";
  id: string;
  title: string;
}) {
  const { data, error } = useHistory(farmId, kind, id);
  const entries = useMemo(() => data?.data ?? [], [data]);
  const versions = useMemo(() => versionsOf(entries), [entries]);
  const [left, setLeft] = useState<string | null>(null);
  const [right, setRight] = useState<string | null>(null);
  const l = versions.find((v) => v.key === left) ?? versions.at(-2) ?? versions[0];
  const r = versions.find((v) => v.key === right) ?? versions.at(-1);
  const rows = l && r ? compareVersions(l.values, r.values, ORDER) : [];
  const headingId = `history-${kind}-${id}`;

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h2 id={headingId} className="text-xl font-bold">
        {title}
      </h2>
      {error && <Notice tone="problem">{error.message}</Notice>}
      {data && entries.length === 0 && <p className="text-ink/70">No changes recorded yet.</p>}
      {entries.length > 0 && (
        <ol className="flex flex-col gap-2" data-testid="history-list">
          {entries.map((e) => {
            const keys = changedKeys(e);
            return (
              <li key={e.id} className="rounded-xl bg-white p-3 ring-1 ring-river-100">
                <p className="font-bold">
                  {when(e.at)} · {e.userName ?? "Rootbank"} · {e.action}
                </p>
                <p className="text-sm">
                  {e.reason ? <>Why: {e.reason}</> : <span className="text-ink/70">No reason given</span>}
                </p>
                {keys.length > 0 && (
                  <ul className="mt-1 text-sm">
                    {keys.map((k) => (
                      <li key={k}>
                        {label(k)}: {show(e.before?.[k])} → <strong>{show(e.after?.[k])}</strong>
                      </li>
                    ))}
                  </ul>
                )}
              </li>
            );
          })}
        </ol>
      )}
      {versions.length >= 2 && l && r && (
        <div className="flex flex-col gap-2">
          <h3 className="font-bold">Compare two versions</h3>
          <div className="grid gap-2 sm:grid-cols-2">
            {(
              [
                ["Left", l.key, setLeft],
                ["Right", r.key, setRight],
              ] as const
            ).map(([side, value, setter]) => (
              <label key={side} className="flex min-w-0 flex-col gap-1 text-sm font-bold">
                {side} version
                <select
                  className="tap w-full min-w-0 rounded-xl border border-river-300 bg-white px-2 py-2 font-normal"
                  value={value}
                  onChange={(e) => setter(e.target.value)}
                >
                  {versions.map((v) => (
                    <option key={v.key} value={v.key}>
                      {when(v.at)} — {v.label}
                    </option>
                  ))}
                </select>
              </label>
            ))}
          </div>
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="version-compare">
              <thead>
                <tr className="text-left">
                  <th scope="col" className="p-2">
                    Value
                  </th>
                  <th scope="col" className="p-2">
                    Left
                  </th>
                  <th scope="col" className="p-2">
                    Right
                  </th>
                </tr>
              </thead>
              <tbody>
                {rows.map((row) => (
                  <tr
                    key={row.key}
                    className={row.changed ? "bg-clay-50 font-bold" : ""}
                    data-changed={row.changed ? "yes" : undefined}
                  >
                    <th scope="row" className="p-2 text-left font-normal">
                      {label(row.key)}
                      {row.changed && <span className="ml-1 text-xs text-clay-700">(changed)</span>}
                    </th>
                    <td className="p-2">{show(row.left)}</td>
                    <td className="p-2">{show(row.right)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      )}
    </section>
  );
}
