import "server-only";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import type { FileStore, StoredFile } from "./index";

const KEY = /^[A-Za-z0-9_-]+(\/[A-Za-z0-9_-]+)*\.[a-z0-9]+$/;

const TYPE_OF_EXTENSION: Record<string, string> = {
  jpg: "image/jpeg",
  png: "image/png",
  webp: "image/webp",
  heic: "image/heic",
};

/**
 * Files on local disk under `root`. The content type is not stored beside the file: it follows from the
 * key's extension, which the uploader chose from the file's own bytes.
 */
export function localDiskStore(root: string): FileStore {
  function fileOf(key: string): string {
    // Keys are made by the app, never by a client; refusing anything else keeps paths inside root.
    if (!KEY.test(key)) throw new Error(`not a storage key: ${key}`);
    return path.join(root, key);
  }

  return {
    async put(key: string, data: Uint8Array): Promise<void> {
      const file = fileOf(key);
      await mkdir(path.dirname(file), { recursive: true });
      // Written aside and renamed so a reader never sees half a file.
      const partial = `${file}.${process.pid}.partial`;
      await writeFile(partial, data);
      await rename(partial, file);
    },
    async get(key: string): Promise<StoredFile | undefined> {
      try {
        const data = await readFile(fileOf(key));
        const ext = key.slice(key.lastIndexOf(".") + 1);
        return { data: new Uint8Array(data), contentType: TYPE_OF_EXTENSION[ext] ?? "application/octet-stream" };
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === "ENOENT") return undefined;
        throw err;
      }
    },
    async delete(key: string): Promise<void> {
      await rm(fileOf(key), { force: true });
    },
  };
}
