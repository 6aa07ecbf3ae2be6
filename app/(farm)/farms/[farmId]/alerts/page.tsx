import type { Metadata } from "next";
import { AlertCentre } from "@/components/alerts/alert-centre";
import { AlertSettings } from "@/components/alerts/alert-settings";
import { PushDevice } from "@/components/alerts/push-device";
import { SentLog } from "@/components/alerts/sent-log";
import { requireFarmPage } from "@/lib/auth/session";
import { can } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Alerts" };

export default async function AlertsPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { role } = await requireFarmPage(farmId, "view");
  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-2xl font-bold">Alerts</h1>
      <p className="text-sm text-ink/80">
        Alerts come from the fields&apos; water accounts and the outlook: they are estimates. Confirm with a field check before you irrigate, and follow local water rules and licensed advice.
      </p>
      <AlertCentre farmId={farmId} />
      <section aria-labelledby="alert-rules-title" className="flex flex-col gap-3">
        <h2 id="alert-rules-title" className="text-xl font-bold">
          My alert rules
        </h2>
        <PushDevice />
        <AlertSettings farmId={farmId} />
      </section>
      {can(role, "manageMembers") && (
        <section aria-labelledby="sent-log-title" className="flex flex-col gap-2">
          <h2 id="sent-log-title" className="text-xl font-bold">
            Sent log
          </h2>
          <SentLog farmId={farmId} />
        </section>
      )}
    </div>
  );
}
