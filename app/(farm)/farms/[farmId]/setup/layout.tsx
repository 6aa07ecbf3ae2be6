import type { ReactNode } from "react";
import { requireFarmPage } from "@/lib/auth/session";

// Set-up is for owners and managers: the check sits outside this segment's loading boundary, so it is a real 403.
export default async function SetupLayout({ children, params }: { children: ReactNode; params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "editSetup");
  return children;
}
