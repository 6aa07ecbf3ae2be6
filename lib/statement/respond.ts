import "server-only";
import { getFarm } from "@/db/farms";
import { AppError } from "@/lib/api/errors";
import { farmToday } from "@/lib/farm-time";
import type { StatementQuery, StatementSelection } from "@/lib/validation/statement";
import { buildStatement } from "./build";
import { statementCsv } from "./csv";
import { statementFileName } from "./format";
import { statementPdf } from "./pdf";
import type { Statement } from "./types";

/** The farm's statement for a selection, made on the farm's today. */
export async function farmStatement(farmId: string, selection: StatementSelection): Promise<Statement> {
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  return buildStatement(farm, selection, farmToday(farm.timeZone));
}

export function fileNameOf(s: Statement, ext: "csv" | "pdf"): string {
  return statementFileName(s.farm.name, s.period, s.field?.name ?? null, ext);
}

/** The statement as JSON, or as a CSV or PDF download. */
export async function statementResponse(farmId: string, query: StatementQuery): Promise<Response | Statement> {
  const { format, ...selection } = query;
  const s = await farmStatement(farmId, selection);
  if (format === "json") return s;
  const headers = (type: string, ext: "csv" | "pdf") => ({
    "Content-Type": type,
    "Content-Disposition": `attachment; filename="${fileNameOf(s, ext)}"`,
    "Cache-Control": "private, no-store",
  });
  if (format === "csv") return new Response(statementCsv(s), { headers: headers("text/csv; charset=utf-8", "csv") });
  return new Response(new Uint8Array(await statementPdf(s)), { headers: headers("application/pdf", "pdf") });
}
