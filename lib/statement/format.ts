/** Words and numbers of the statement as people read them (screen, PDF, e-mail). Pure and client-safe. */
import { formatLocalDate } from "@/lib/units";
import type { AllocationLevel } from "./allocation";
import type { StatementPeriod } from "./types";

/** A number with thousands separators and a fixed number of decimals; "−0.0" is written "0.0". */
export function formatNumber(value: number | null | undefined, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  const s = value.toLocaleString("en", { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s;
}

/** A share as a whole percentage, "82 %". */
export function formatShare(share: number | null | undefined): string {
  if (share === null || share === undefined) return "—";
  if (!Number.isFinite(share)) return "over the limit";
  return `${Math.round(share * 100)} %`;
}

/** "Water year 2026-27" or "Crop season 2026-27". */
export function periodTitle(p: StatementPeriod): string {
  return p.kind === "water-year" ? `Water year ${p.label}` : `Crop season ${p.season}`;
}

/** "1 Jul 2026 to 30 Jun 2027" */
export function periodSpan(p: { from: string; to: string }): string {
  const long = (d: string) => formatLocalDate(d, "long").replace(/^\w{3} /, "");
  return `${long(p.from)} to ${long(p.to)}`;
}

/** File name of a download or attachment, e.g. rootbank-statement-kestrel-bend-2026-27.pdf */
export function statementFileName(farmName: string, p: StatementPeriod, fieldName: string | null, ext: "csv" | "pdf"): string {
  const slug = (s: string) =>
    s
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "");
  const when = p.kind === "water-year" ? p.label : `season-${p.season}`;
  return ["rootbank-statement", slug(farmName), fieldName ? slug(fieldName) : "", slug(when)].filter(Boolean).join("-") + `.${ext}`;
}

/** What the allocation band says. */
export const ALLOCATION_WORDS: Record<AllocationLevel, string> = {
  "no-limit": "No allocation is set for this farm, so use is shown without a limit.",
  within: "Use is within the allocation.",
  approaching: "Use has passed 80 % of the allocation. Plan the rest of the year's water with care.",
  reached: "Use has reached or passed the allocation. Check your licence conditions before irrigating further.",
};

/** The caution every statement carries. */
export const STATEMENT_CAUTION =
  "These figures are estimates from Rootbank's daily water account: rain from the farm's gauges, irrigation as logged, crop ET from the weather. " +
  "Confirm them with meter readings and field checks, and follow your local water rules, licence conditions and licensed advice before relying on them.";
