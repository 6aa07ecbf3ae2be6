import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFarm } from "@/db/farms";
import { FarmPlan } from "@/components/plan/farm-plan";
import { requireFarmPage } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Farm plan" };

export default async function PlanPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user } = await requireFarmPage(farmId, "view");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  return <FarmPlan farmId={farmId} farmName={farm.name} initialUnits={user.unitSystem} />;
}
