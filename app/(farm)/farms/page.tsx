import type { Metadata } from "next";
import Link from "next/link";
import { listFarmsOfUser } from "@/db/memberships";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { Logo } from "@/components/ui/logo";
import { requirePageUser } from "@/lib/auth/session";
import { ROLE_LABELS } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Your farms" };

export default async function FarmsPage() {
  const user = await requirePageUser();
  const farms = await listFarmsOfUser(user.id);
  return (
    <main className="mx-auto flex max-w-2xl flex-col gap-5 px-5 py-8">
      <div className="flex items-center justify-between">
        <div className="flex items-center gap-3">
          <Logo />
          <h1 className="text-2xl font-bold">Your farms</h1>
        </div>
        <SignOutButton />
      </div>
      {farms.length === 0 ? (
        <p>You are not a member of any farm yet. Ask a farm&apos;s owner or manager to invite you.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {farms.map((farm) => (
            <li key={farm.id}>
              <Link
                href={`/farms/${farm.id}`}
                className="tap flex items-center justify-between rounded-2xl bg-white px-5 py-4 shadow-sm ring-1 ring-river-100 hover:ring-river-300"
              >
                <span className="text-lg font-bold">{farm.name}</span>
                <span className="text-sm text-ink/70">{ROLE_LABELS[farm.role]}</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
