import type { Metadata } from "next";
import { MembersPanel } from "@/components/members/members-panel";
import { requireFarmPage } from "@/lib/auth/session";

export const metadata: Metadata = { title: "People" };

export default async function MembersPage({ params }: { params: Promise<{ farmId: string }> }) {
  const { farmId } = await params;
  const { user, role } = await requireFarmPage(farmId, "manageMembers");
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">People on this farm</h1>
      {role === "manager" && <p className="text-ink/80">As farm manager you can invite, change and remove field workers.</p>}
      <MembersPanel farmId={farmId} myRole={role} myUserId={user.id} />
    </div>
  );
}
