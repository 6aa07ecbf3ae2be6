import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFarm } from "@/db/farms";
import { StatementView } from "@/components/statement/statement-view";
import { can } from "@/lib/auth/roles";
import { requireFarmPage } from "@/lib/auth/session";
import { statementQuerySchema } from "@/lib/validation/statement";

export const metadata: Metadata = { title: "Season statement" };

export default async function StatementPage({
  params,
  searchParams,
}: {
  params: Promise<{ farmId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { farmId } = await params;
  // A shared link opens the same choice; a garbled one opens the current water year.
  const query = statementQuerySchema.safeParse(await searchParams);
  const { fieldId, waterYear, season } = query.success ? query.data : {};
  const { user, role } = await requireFarmPage(farmId, "readStatement");
  const farm = await getFarm(farmId);
  if (!farm) notFound();
  return (
    <StatementView
      farmId={farmId}
      initialUnits={user.unitSystem}
      initialChoice={{ fieldId, waterYear, season }}
      canEditYield={can(role, "editAgronomy")}
    />
  );
}
