import "server-only";
import { finishImport, getImportById } from "@/db/imports";
import { db } from "@/db/knex";
import { processImport } from "@/lib/imports/run";
import { parseImportRequest } from "@/lib/imports/options";
import { fileStore } from "@/lib/storage";
import { importFileKey, type ImportJobData } from "@/lib/imports/background";

const NOTHING = { rows: 0, accepted: 0, rejected: 0, inserted: 0, updated: 0, unchanged: 0 };

/**
 * Runs one queued import. An import that is no longer processing (finished by an earlier attempt) is left
 * as it is; one whose file or sender is gone fails with a message rather than staying "processing".
 */
export async function runImportJob(data: ImportJobData): Promise<"done" | "skipped" | "failed"> {
  const record = await getImportById(data.importId);
  if (!record || record.status !== "processing") return "skipped";
  const key = importFileKey(record.farmId, record.id);
  const stored = await fileStore().get(key);
  const fail = async (warning: string) => {
    await finishImport(db, record.id, "failed", NOTHING, { unit: "line", rejected: [], written: false, warnings: [warning] });
    await fileStore().delete(key);
    return "failed" as const;
  };
  if (!stored) return fail("The uploaded file was lost before it could be read; send it again.");
  if (!record.createdBy) return fail("The person who sent the file no longer has an account; nothing was written.");
  await processImport({
    importId: record.id,
    farmId: record.farmId,
    userId: record.createdBy,
    fileName: record.fileName,
    bytes: stored.data,
    request: parseImportRequest(record.kind, record.options),
  });
  await fileStore().delete(key);
  return "done";
}
