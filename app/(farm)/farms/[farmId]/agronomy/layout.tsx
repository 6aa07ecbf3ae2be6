import type { ReactNode } from "react";
import { requireFarmPage } from "@/lib/auth/session";

// Crop tuning is for owners, managers and agronomists: checked outside this segment's loading boundary, so a refusal is a real 403.
export default async function AgronomyLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ farmId: string }>;
}) {
  const { farmId } = await params;
  await requireFarmPage(farmId, "editAgronomy");
  return children;
}
