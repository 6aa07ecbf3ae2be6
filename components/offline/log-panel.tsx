"use client";

import { useState } from "react";
import { IrrigationForm } from "@/components/forms/irrigation-form";
import { RainForm } from "@/components/forms/rain-form";
import { SoilCheckForm } from "@/components/forms/soil-check-form";
import { Notice } from "@/components/ui/notice";
import { useFields, useGauges, useSystems, type FieldDto, type GaugeDto, type ListOf, type SystemDto } from "@/lib/client/use-farm-setup";
import { useLogQueue, useOnline, type NewEntry } from "@/lib/client/use-log-queue";
import type { EntryKind } from "@/lib/offline/queue";
import { EntryList } from "./entry-list";

const TABS: { kind: EntryKind; label: string }[] = [
  { kind: "rain", label: "Rain" },
  { kind: "irrigation", label: "Irrigation" },
  { kind: "soil", label: "Soil check" },
];

export interface LogPanelProps {
  farmId: string;
  userId: string;
  timeZone: string;
  gauges: ListOf<GaugeDto>;
  fields: ListOf<FieldDto>;
  systems: ListOf<SystemDto>;
}

/** The worker's log: three forms that all save to the phone first, and the list of what is waiting. */
export function LogPanel({ farmId, userId, timeZone, ...initial }: LogPanelProps) {
  const [tab, setTab] = useState<EntryKind>("rain");
  const [saved, setSaved] = useState<{ id: string; summary: string } | null>(null);
  const online = useOnline();
  const queue = useLogQueue(farmId, userId);
  const live = (l: { archivedAt: string | null }) => l.archivedAt === null;
  const gauges = (useGauges(farmId, initial.gauges).data ?? initial.gauges).data.filter(live);
  const fields = (useFields(farmId, initial.fields).data ?? initial.fields).data.filter(live);
  const systems = (useSystems(farmId, initial.systems).data ?? initial.systems).data.filter(live);

  async function log(entry: NewEntry) {
    const id = await queue.enqueue(entry);
    setSaved({ id, summary: entry.summary });
  }

  const savedEntry = queue.entries?.find((e) => e.id === saved?.id);
  return (
    <div className="flex flex-col gap-5">
      {!online && (
        <Notice>
          <strong>No connection.</strong> What you log is kept on this phone and sent when the connection is back.
        </Notice>
      )}
      <div role="tablist" aria-label="What to log" className="grid grid-cols-3 gap-2">
        {TABS.map((t) => (
          <button
            key={t.kind}
            role="tab"
            id={`tab-${t.kind}`}
            aria-selected={tab === t.kind}
            aria-controls="log-form"
            onClick={() => {
              setTab(t.kind);
              setSaved(null);
            }}
            className={`tap rounded-xl px-2 text-base font-bold ring-2 ${tab === t.kind ? "bg-river-900 text-white ring-river-900" : "bg-white text-river-900 ring-river-300"}`}
          >
            {t.label}
          </button>
        ))}
      </div>
      {saved && (
        <Notice tone="success">
          <strong>Saved on this phone.</strong> {saved.summary}.{" "}
          {savedEntry?.status === "sent" ? "It has reached the farm's records." : savedEntry?.status === "rejected" ? "The server did not accept it: see below." : "It is sent as soon as there is a connection."}
        </Notice>
      )}
      <section id="log-form" role="tabpanel" aria-labelledby={`tab-${tab}`} className="rounded-2xl bg-white p-4 shadow-sm ring-1 ring-river-100">
        {tab === "rain" && <RainForm farmId={farmId} timeZone={timeZone} gauges={gauges.filter((g) => g.kind === "manual")} onLog={log} />}
        {tab === "irrigation" && <IrrigationForm timeZone={timeZone} fields={fields} systems={systems} onLog={log} />}
        {tab === "soil" && <SoilCheckForm timeZone={timeZone} fields={fields} onLog={log} />}
      </section>
      <section aria-labelledby="on-phone-heading" className="flex flex-col gap-2">
        <h2 id="on-phone-heading" className="text-xl font-bold">
          Logged on this phone
        </h2>
        {queue.entries === null ? (
          <p className="text-ink/70">Opening the phone&apos;s store…</p>
        ) : (
          <EntryList entries={queue.entries} onResend={(id, c) => void queue.resend(id, c)} onDiscard={(id) => void queue.discard(id)} onSendNow={() => void queue.sendNow()} />
        )}
      </section>
    </div>
  );
}
