import type { ReactNode } from "react";
import { requireFarmPage } from "@/lib/auth/session";

// Viewers may see the farm but not log: the check sits outside this segment's loading boundary, so it is a real 403.
export default async function LogLayout({ children, params }: { children: ReactNode; params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "log");
  return children;
}
