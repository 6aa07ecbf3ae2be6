import Link from "next/link";
import { AlertBell } from "@/components/alerts/alert-bell";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { FarmNav } from "@/components/farm/farm-nav";
import { Logo } from "@/components/ui/logo";
import { can, ROLE_LABELS, type Role } from "@/lib/auth/roles";

export function FarmHeader({ farmId, farmName, role, userName }: { farmId: string; farmName: string; role: Role; userName: string }) {
  const links = [
    { href: `/farms/${farmId}`, label: "Map", show: true },
    { href: `/farms/${farmId}/plan`, label: "Plan", show: true },
    { href: `/farms/${farmId}/log`, label: "Log", show: can(role, "log") },
    { href: `/farms/${farmId}/setup`, label: "Set-up", show: can(role, "editSetup") },
    { href: `/farms/${farmId}/agronomy`, label: "Crops", show: can(role, "editAgronomy") },
    { href: `/farms/${farmId}/statement`, label: "Statement", show: can(role, "readStatement") },
    { href: `/farms/${farmId}/members`, label: "People", show: can(role, "manageMembers") },
  ].filter((l) => l.show);
  return (
    <header className="sticky top-0 z-20 border-b border-river-100 bg-white/95 backdrop-blur">
      <div className="mx-auto flex max-w-5xl flex-wrap items-center gap-x-4 gap-y-1 px-4 py-2">
        <Link href="/farms" className="flex items-center gap-2" aria-label="All farms">
          <Logo />
        </Link>
        <div className="min-w-0 flex-1">
          <p className="truncate text-lg font-bold leading-tight">{farmName}</p>
          <p className="text-xs text-ink/70">
            {userName} · {ROLE_LABELS[role]}
          </p>
        </div>
        <AlertBell farmId={farmId} />
        <SignOutButton />
        <FarmNav links={links.map(({ href, label }) => ({ href, label }))} homeHref={`/farms/${farmId}`} />
      </div>
    </header>
  );
}
