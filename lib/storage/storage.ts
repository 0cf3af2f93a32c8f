import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { Readable, Transform, type TransformCallback } from "node:stream";
import type { ReadableStream as WebReadableStream } from "node:stream/web";

/** What `put` accepts: bytes in memory, a Node stream, a web stream (a Request body), or chunks. */
export type StorageBody = Uint8Array | Readable | ReadableStream<Uint8Array> | WebReadableStream<Uint8Array> | AsyncIterable<Uint8Array>;

export interface PutOptions {
  /** Refuse bodies longer than this, bytes; checked while streaming, before the whole body arrives. */
  maxBytes?: number;
  /** Abort the upload (client went away); nothing is left behind. */
  signal?: AbortSignal;
}

export interface StoredObject {
  /** Server-generated key, see `newStorageKey`. */
  key: string;
  /** Bytes written. */
  size: number;
  /** SHA-256 of the bytes, lowercase hex (64 characters). */
  sha256: string;
}

export interface GetOptions {
  /** First byte, inclusive (HTTP Range semantics). */
  start?: number;
  /** Last byte, inclusive. */
  end?: number;
}

/**
 * Object storage as the application needs it. Two drivers implement it: disk (lib/storage/disk.ts)
 * and S3 (lib/storage/s3.ts: a streamed multipart upload with the hash computed on the way
 * through, reads with a Range header, the same keys). tests/integration/storage-contract.test.ts
 * holds both to the same behaviour.
 */
export interface ObjectStorage {
  put(body: StorageBody, options?: PutOptions): Promise<StoredObject>;
  /** Throws StorageError "not_found" for an absent key, "invalid_key" for a malformed one. */
  get(key: string, options?: GetOptions): Promise<Readable>;
  head(key: string): Promise<{ key: string; size: number } | null>;
  exists(key: string): Promise<boolean>;
  /** True if an object was removed, false if there was none. */
  delete(key: string): Promise<boolean>;
  /** Every key, sorted. For tests and maintenance; not for request paths. */
  list(): Promise<string[]>;
}

export type StorageErrorCode = "too_large" | "not_found" | "invalid_key" | "aborted" | "io";

export class StorageError extends Error {
  constructor(
    readonly code: StorageErrorCode,
    message: string,
    /** For "too_large": the limit, bytes. */
    readonly limit?: number,
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = "StorageError";
  }
}

function formatBytes(n: number): string {
  if (n >= 1_000_000) return `${Number((n / 1_000_000).toFixed(1))} MB`;
  if (n >= 1_000) return `${Number((n / 1_000).toFixed(1))} kB`;
  return `${n} bytes`;
}

export const tooLarge = (limit: number) =>
  new StorageError("too_large", `The file is larger than the ${formatBytes(limit)} limit.`, limit);

export const notFoundError = () => new StorageError("not_found", "No stored file has that key.");

/** Counts and hashes bytes on the way to the store; fails as soon as the limit is passed. */
export class ByteMeter extends Transform {
  // Not "size": the S3 upload helper would take a `size` property for the body's total length.
  bytes = 0;
  /** Set once the body passed the limit, whatever error the store then reports. */
  overLimit = false;
  private readonly hash = createHash("sha256");

  constructor(private readonly maxBytes: number) {
    super();
  }

  override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
    this.bytes += chunk.length;
    if (this.bytes > this.maxBytes) {
      this.overLimit = true;
      done(tooLarge(this.maxBytes));
      return;
    }
    this.hash.update(chunk);
    done(null, chunk);
  }

  digest(): string {
    return this.hash.digest("hex");
  }
}

// "<2 hex>/<2 hex>/<uuid v4>": 42 characters, the first four hex digits of the UUID repeated as
// two shard folders so no folder holds more than 1/65536 of the objects.
const KEY = /^([0-9a-f]{2})\/([0-9a-f]{2})\/([0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12})$/;

export const STORAGE_KEY_LENGTH = 42;

/** A fresh key. Never derived from the user's file name. */
export function newStorageKey(): string {
  const id = randomUUID();
  return `${id.slice(0, 2)}/${id.slice(2, 4)}/${id}`;
}

export function isStorageKey(key: string): boolean {
  const m = KEY.exec(key);
  return m !== null && m[3]?.startsWith(`${m[1]}${m[2]}`) === true;
}

export function assertStorageKey(key: string): void {
  if (!isStorageKey(key)) throw new StorageError("invalid_key", "That is not a storage key.");
}

/** Node stream view of any accepted body. */
export function toNodeReadable(body: StorageBody): Readable {
  if (body instanceof Readable) return body;
  if (body instanceof Uint8Array) return Readable.from([body], { objectMode: false });
  if (typeof (body as WebReadableStream<Uint8Array>).getReader === "function") {
    return Readable.fromWeb(body as WebReadableStream<Uint8Array>);
  }
  return Readable.from(body as AsyncIterable<Uint8Array>, { objectMode: false });
}

/** Web stream for a route handler's `new Response(...)`. */
export function toWebStream(stream: Readable): ReadableStream<Uint8Array> {
  return Readable.toWeb(stream) as unknown as ReadableStream<Uint8Array>;
}

/** Reads a whole stream into memory, refusing more than `maxBytes`. */
export async function readAll(stream: Readable, maxBytes = Number.POSITIVE_INFINITY): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of stream) {
    const b = Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array);
    size += b.length;
    if (size > maxBytes) {
      stream.destroy();
      throw tooLarge(maxBytes);
    }
    chunks.push(b);
  }
  return Buffer.concat(chunks, size);
}
