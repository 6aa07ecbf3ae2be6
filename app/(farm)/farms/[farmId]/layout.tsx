import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { getFarm } from "@/db/farms";
import { FarmHeader } from "@/components/farm/farm-header";
import { requireFarmPage } from "@/lib/auth/session";

export default async function FarmLayout({ children, params }: { children: ReactNode; params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user, role } = await requireFarmPage(farmId, "view");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  return (
    <>
      <FarmHeader farmId={farmId} farmName={farm.name} role={role} userName={user.name} />
      <main className="mx-auto max-w-5xl px-4 py-5">{children}</main>
    </>
  );
}
