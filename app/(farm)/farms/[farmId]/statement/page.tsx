import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFarm } from "@/db/farms";
import { StatementView } from "@/components/statement/statement-view";
import { requireFarmPage } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Season statement" };

export default async function StatementPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user } = await requireFarmPage(farmId, "readStatement");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  return <StatementView farmId={farmId} initialUnits={user.unitSystem} />;
}
