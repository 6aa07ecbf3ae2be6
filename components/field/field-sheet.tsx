"use client";

import dynamic from "next/dynamic";
import Link from "next/link";
import { mapBand } from "@/components/map/bands";
import { UnitSwitch } from "@/components/map/unit-switch";
import { Notice } from "@/components/ui/notice";
import { useFarmStatus } from "@/lib/client/use-farm-status";
import { useFieldAccount } from "@/lib/client/use-field-account";
import { useFieldOutlook } from "@/lib/client/use-field-outlook";
import { useGauges } from "@/lib/client/use-gauges";
import { useSystems } from "@/lib/client/use-systems";
import { useUnits } from "@/lib/client/use-units";
import { formatArea, formatLocalDate, type UnitSystem } from "@/lib/units";
import { AccountTable } from "./account-table";
import { NextAction } from "./next-action";
import { RootZoneGauge } from "./root-zone-gauge";
import { WhyPanel } from "./why-panel";

// recharts is large; the sheet's words and numbers show first, the chart follows.
const AccountChart = dynamic(() => import("@/components/charts/account-chart").then((m) => m.AccountChart), {
  ssr: false,
  loading: () => <p className="h-80 text-ink/75">Drawing the chart…</p>,
});

export interface FieldSheetProps {
  farmId: string;
  field: { id: string; name: string; areaHa: number; cropName: string | null; soilName: string | null; systemId: string | null };
  today: string;
  accountFrom: string;
  accountTo: string;
  initialUnits: UnitSystem;
}

/** One field's sheet: where the root zone stands, what to do next and why, and the account day by day. */
export function FieldSheet({ farmId, field, today, accountFrom, accountTo, initialUnits }: FieldSheetProps) {
  const { units } = useUnits(initialUnits);
  const account = useFieldAccount(farmId, field.id, accountFrom, accountTo);
  const outlook = useFieldOutlook(farmId, field.id, 10);
  const status = useFarmStatus(farmId);
  const systems = useSystems(farmId);
  const gauges = useGauges(farmId);
  const s = status.data?.data.find((x) => x.id === field.id);
  const system = systems.data?.data.find((x) => x.id === field.systemId);
  const days = account.data?.data ?? [];
  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <Link href={`/farms/${farmId}`} className="tap inline-flex items-center font-bold text-river-700 underline">
            ← Farm map
          </Link>
          <h1 className="text-2xl font-bold">{field.name}</h1>
          <p className="text-sm text-ink/80">
            {formatArea(field.areaHa, units)} · {field.cropName ?? "no crop now"} · {field.soilName ?? "soil not set"} · {system?.name ?? "no irrigation system"}
          </p>
        </div>
        <UnitSwitch initial={initialUnits} />
      </div>
      {account.data?.dirtyFrom && <Notice>The account is being brought up to date from {formatLocalDate(account.data.dirtyFrom)}.</Notice>}
      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-labelledby="root-zone" className="rounded-2xl bg-white p-4 ring-1 ring-river-100">
          <h2 id="root-zone" className="mb-2 text-lg font-bold">
            Root zone now
          </h2>
          {s && s.depletionMm !== null && s.tawMm && s.rawMm !== null && s.triggerMm !== null ? (
            <RootZoneGauge depletionMm={s.depletionMm} tawMm={s.tawMm} rawMm={s.rawMm} triggerMm={s.triggerMm} band={mapBand(s)} units={units} />
          ) : (
            <p className="text-ink/80">{status.isLoading ? "Loading…" : "No water account yet: the field needs a soil, a planting and weather."}</p>
          )}
          {s?.lastAccountDate && <p className="mt-2 text-sm text-ink/75">As at the end of {formatLocalDate(s.lastAccountDate, "long")}.</p>}
        </section>
        {outlook.data ? (
          <NextAction outlook={outlook.data} system={system} today={today} units={units} />
        ) : (
          <section className="rounded-2xl bg-white p-4 ring-1 ring-river-100">
            <h2 className="text-lg font-bold">Next action</h2>
            <p className="text-ink/80">{outlook.error ? outlook.error.message : "Working out the outlook…"}</p>
          </section>
        )}
      </div>
      <section aria-labelledby="weeks" className="rounded-2xl bg-white p-4 ring-1 ring-river-100">
        <h2 id="weeks" className="mb-2 text-lg font-bold">
          The last weeks and the outlook
        </h2>
        {account.error ? (
          <Notice tone="problem">{account.error.message}</Notice>
        ) : (
          <AccountChart past={days} future={outlook.data?.days ?? []} today={today} units={units} />
        )}
      </section>
      <WhyPanel days={days} outlook={outlook.data} gauges={gauges.data?.data ?? []} units={units} />
      <section aria-labelledby="account" className="flex flex-col gap-2">
        <h2 id="account" className="text-lg font-bold">
          Water account, day by day
        </h2>
        {days.length ? <AccountTable days={days} units={units} /> : <p className="text-ink/80">{account.isLoading ? "Loading the account…" : "No account days stored yet."}</p>}
      </section>
    </div>
  );
}
