import type { ReactNode } from "react";
import { Logo } from "@/components/ui/logo";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-5 py-10">
      <div className="flex items-center gap-3">
        <Logo className="h-11 w-11" />
        <div>
          <p className="text-2xl font-bold tracking-tight">Rootbank</p>
          <p className="text-sm text-ink/70">The water account of every field</p>
        </div>
      </div>
      <div className="rounded-2xl bg-white p-5 shadow-sm ring-1 ring-river-100">{children}</div>
    </main>
  );
}
