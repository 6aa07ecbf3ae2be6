import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { LogPanel } from "@/components/offline/log-panel";
import { getFarm } from "@/db/farms";
import { listFields } from "@/db/fields";
import { listGauges } from "@/db/gauges";
import { listIrrigationSystems } from "@/db/irrigation-systems";
import { requireFarmPage } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Log" };

const ALL = { limit: 1000, offset: 0 };

export default async function LogPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user } = await requireFarmPage(farmId, "log");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  const [gauges, fields, systems] = await Promise.all([listGauges(farmId, ALL), listFields(farmId, ALL), listIrrigationSystems(farmId, ALL)]);
  return (
    <div className="mx-auto flex max-w-xl flex-col gap-4">
      <h1 className="text-2xl font-bold">Log from the field</h1>
      <p className="text-ink/80">Rain, irrigation and soil checks. Entries are kept on this phone and sent when there is a connection.</p>
      <LogPanel
        farmId={farmId}
        userId={user.id}
        timeZone={farm.timeZone}
        gauges={{ data: gauges.rows }}
        fields={{ data: fields.rows }}
        systems={{ data: systems.rows }}
      />
    </div>
  );
}
