import type { ReactNode } from "react";
import { requireFarmPage } from "@/lib/auth/session";

// The role check sits in the layout, outside this segment's loading boundary, so a refusal is a real 403.
export default async function StatementLayout({ children, params }: { children: ReactNode; params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "readStatement");
  return children;
}
