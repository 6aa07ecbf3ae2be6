import "server-only";
import { JOBS, queue } from "@/lib/jobs/queue";
import { fileStore } from "@/lib/storage";

/** Data of an `import-file` job. */
export interface ImportJobData {
  importId: string;
}

/** Where a large upload waits for the worker, in the app's file store. */
export function importFileKey(farmId: string, importId: string): string {
  return `farms/${farmId}/imports/${importId}.upload`;
}

/**
 * Hands a large import to the workers: the file is kept in the file store and a queued job names the
 * import, so the work survives a restart of the app server that took the upload (and of the worker: a
 * job whose worker died is handed out again by the queue once it expires).
 */
export async function queueImport(farmId: string, importId: string, bytes: Uint8Array): Promise<void> {
  await fileStore().put(importFileKey(farmId, importId), bytes, "application/octet-stream");
  const boss = await queue();
  await boss.send(JOBS.importFile, { importId } satisfies ImportJobData, {
    singletonKey: importId,
    retryLimit: 3,
    retryBackoff: true,
    expireInSeconds: 30 * 60,
  });
}
