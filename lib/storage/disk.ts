import "server-only";
import { randomUUID } from "node:crypto";
import { constants, createWriteStream } from "node:fs";
import fs from "node:fs/promises";
import path from "node:path";
import type { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import {
  assertStorageKey,
  ByteMeter,
  isStorageKey,
  newStorageKey,
  notFoundError,
  StorageError,
  toNodeReadable,
  tooLarge,
  type GetOptions,
  type ObjectStorage,
  type PutOptions,
  type StorageBody,
  type StoredObject,
} from "@/lib/storage/storage";

export interface DiskStorageOptions {
  /** Root folder (the app passes STORAGE_DIR, default ".data/storage"); relative paths resolve against the working directory. */
  rootDir: string;
}

// Uploads in progress live here, on the same file system as the objects, so the final
// rename is atomic (POSIX rename(2)): a reader sees the whole object or none.
const TEMP_DIR = ".tmp";

function isErrno(e: unknown, code: string): boolean {
  return typeof e === "object" && e !== null && (e as { code?: unknown }).code === code;
}

export function createDiskStorage(options: DiskStorageOptions): ObjectStorage & { purgeTemp(olderThanMs: number): Promise<number> } {
  const root = path.resolve(options.rootDir);
  const tempDir = path.join(root, TEMP_DIR);
  const fileOf = (key: string): string => {
    assertStorageKey(key);
    return path.join(root, ...key.split("/"));
  };

  async function put(body: StorageBody, opts: PutOptions = {}): Promise<StoredObject> {
    const maxBytes = opts.maxBytes ?? Number.POSITIVE_INFINITY;
    if (body instanceof Uint8Array && body.length > maxBytes) throw tooLarge(maxBytes);
    if (opts.signal?.aborted) throw new StorageError("aborted", "The upload was cancelled.");
    await fs.mkdir(tempDir, { recursive: true });
    const temp = path.join(tempDir, `${randomUUID()}.part`);
    const meter = new ByteMeter(maxBytes);
    try {
      const out = createWriteStream(temp, { flags: "wx", mode: 0o640, flush: true });
      await pipeline(toNodeReadable(body), meter, out, opts.signal ? { signal: opts.signal } : {});
      const key = newStorageKey();
      const file = fileOf(key);
      await fs.mkdir(path.dirname(file), { recursive: true });
      await fs.rename(temp, file);
      return { key, size: meter.bytes, sha256: meter.digest() };
    } catch (e) {
      await fs.rm(temp, { force: true });
      if (e instanceof StorageError) throw e;
      if (opts.signal?.aborted || (e instanceof Error && e.name === "AbortError")) {
        throw new StorageError("aborted", "The upload was cancelled.", undefined, { cause: e });
      }
      throw new StorageError("io", "The file could not be stored.", undefined, { cause: e });
    }
  }

  async function get(key: string, range: GetOptions = {}): Promise<Readable> {
    const file = fileOf(key);
    let handle: fs.FileHandle;
    try {
      handle = await fs.open(file, constants.O_RDONLY);
    } catch (e) {
      if (isErrno(e, "ENOENT")) throw notFoundError();
      throw new StorageError("io", "The stored file could not be read.", undefined, { cause: e });
    }
    // The stream owns the descriptor and closes it when done or destroyed.
    return handle.createReadStream({ start: range.start, end: range.end });
  }

  async function head(key: string): Promise<{ key: string; size: number } | null> {
    try {
      const st = await fs.stat(fileOf(key));
      return st.isFile() ? { key, size: st.size } : null;
    } catch (e) {
      if (isErrno(e, "ENOENT")) return null;
      throw e;
    }
  }

  async function remove(key: string): Promise<boolean> {
    const file = fileOf(key);
    try {
      await fs.unlink(file);
    } catch (e) {
      if (isErrno(e, "ENOENT")) return false;
      throw new StorageError("io", "The stored file could not be deleted.", undefined, { cause: e });
    }
    // Tidy empty shard folders; another upload may be filling them, so failure is fine.
    await fs.rmdir(path.dirname(file)).catch(() => undefined);
    await fs.rmdir(path.dirname(path.dirname(file))).catch(() => undefined);
    return true;
  }

  async function list(): Promise<string[]> {
    let entries: string[];
    try {
      entries = await fs.readdir(root, { recursive: true });
    } catch (e) {
      if (isErrno(e, "ENOENT")) return [];
      throw e;
    }
    return entries
      .map((p) => p.split(path.sep).join("/"))
      .filter(isStorageKey)
      .sort();
  }

  /** Removes uploads abandoned by a crash mid-write; returns how many. */
  async function purgeTemp(olderThanMs: number): Promise<number> {
    let names: string[];
    try {
      names = await fs.readdir(tempDir);
    } catch (e) {
      if (isErrno(e, "ENOENT")) return 0;
      throw e;
    }
    const cutoff = Date.now() - olderThanMs;
    let removed = 0;
    for (const name of names) {
      const p = path.join(tempDir, name);
      const st = await fs.stat(p).catch(() => null);
      if (st && st.mtimeMs < cutoff) {
        await fs.rm(p, { force: true });
        removed++;
      }
    }
    return removed;
  }

  return {
    put,
    get,
    head,
    exists: async (key) => (await head(key)) !== null,
    delete: remove,
    list,
    purgeTemp,
  };
}
