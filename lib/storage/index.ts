import "server-only";
import path from "node:path";
import { env } from "@/lib/env";
import { localDiskStore } from "./local-disk";

/** A stored file as it comes back: its bytes and the content type it was stored with. */
export interface StoredFile {
  data: Uint8Array;
  contentType: string;
}

/**
 * Where uploaded files live. Keys are relative paths (`farms/<id>/rain-readings/<id>.jpg`) so the same
 * key works on local disk and in an S3-compatible bucket; every app server must see the same store.
 */
export interface FileStore {
  put(key: string, data: Uint8Array, contentType: string): Promise<void>;
  /** undefined when nothing is stored under the key */
  get(key: string): Promise<StoredFile | undefined>;
  /** removing a key that is not there is not an error */
  delete(key: string): Promise<void>;
}

const globalForStore = globalThis as unknown as { rootbankFileStore?: FileStore };

/** The configured store: local disk under UPLOAD_DIR (default .data/uploads). */
export function fileStore(): FileStore {
  globalForStore.rootbankFileStore ??= localDiskStore(path.resolve(env().UPLOAD_DIR));
  return globalForStore.rootbankFileStore;
}
