import type { ReactNode } from "react";

type Tone = "info" | "success" | "problem";

const TONES: Record<Tone, string> = {
  info: "bg-river-50 text-river-900 ring-river-100",
  success: "bg-reed-100 text-reed-700 ring-reed-500/30",
  problem: "bg-clay-50 text-clay-900 ring-clay-300",
};

export function Notice({ tone = "info", children }: { tone?: Tone; children: ReactNode }) {
  return (
    <div role={tone === "problem" ? "alert" : "status"} className={`rounded-xl px-4 py-3 ring-1 ${TONES[tone]}`}>
      {children}
    </div>
  );
}
