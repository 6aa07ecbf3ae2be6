import { redirect } from "next/navigation";
import { listFarmsOfUser } from "@/db/memberships";
import { requirePageUser } from "@/lib/auth/session";

/** Home: straight to the person's farm, or the list when they belong to several. */
export default async function Home() {
  const user = await requirePageUser();
  const farms = await listFarmsOfUser(user.id);
  if (farms.length === 1) redirect(`/farms/${farms[0]!.id}`);
  redirect("/farms");
}
