import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFarm } from "@/db/farms";
import { getField, listFieldSummaries } from "@/db/fields";
import { FieldSheet } from "@/components/field/field-sheet";
import { isUuid, requireFarmPage } from "@/lib/auth/session";
import { farmToday } from "@/lib/farm-time";
import { addDaysIso } from "@/lib/waterbalance";

export const metadata: Metadata = { title: "Field" };

/** Days of the account the sheet shows before today (four weeks: two irrigation cycles, common practice, no source). */
const SHOWN_DAYS = 28;

export default async function FieldPage({ params }: { params: Promise<{ farmId: string; fieldId: string }> }) {
  const { farmId, fieldId } = await params;
  const { user } = await requireFarmPage(farmId, "view");
  const farm = await getFarm(farmId);
  const field = isUuid(fieldId) ? await getField(farmId, fieldId) : undefined;
  if (!farm || !field || field.archivedAt) notFound();
  const today = farmToday(farm.timeZone);
  const summary = (await listFieldSummaries(farmId, today)).find((f) => f.id === field.id);
  return (
    <FieldSheet
      farmId={farmId}
      field={{ id: field.id, name: field.name, areaHa: field.areaHa, cropName: summary?.cropName ?? null, soilName: summary?.soilName ?? null, systemId: field.irrigationSystemId }}
      today={today}
      accountFrom={addDaysIso(today, -SHOWN_DAYS)}
      accountTo={addDaysIso(today, -1)}
      initialUnits={user.unitSystem}
    />
  );
}
