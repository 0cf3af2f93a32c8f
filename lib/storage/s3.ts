import "server-only";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  S3Client,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { Upload } from "@aws-sdk/lib-storage";
import { Readable, Transform } from "node:stream";
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

export interface S3StorageOptions {
  bucket: string;
  region: string;
  /** For S3-compatible stores (and the local fake); absent → the provider's regional endpoint. */
  endpoint?: string;
  /** Path-style URLs (endpoint/bucket/key); most self-hosted S3-compatible stores need it. */
  forcePathStyle?: boolean;
  /** Both or neither; neither → the SDK's default chain (instance role, AWS_* variables, profile). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** Multipart part size, bytes; S3's minimum is 5 MiB (the last part may be smaller). */
  partSize?: number;
  /** Parts in flight per upload; memory per upload is at most partSize × queueSize. */
  queueSize?: number;
}

const MIN_PART = 5 * 1024 * 1024;

function statusOf(e: unknown): number | undefined {
  return e instanceof S3ServiceException ? e.$metadata.httpStatusCode : (e as { $metadata?: { httpStatusCode?: number } } | null)?.$metadata?.httpStatusCode;
}

function nameOf(e: unknown): string | undefined {
  return e instanceof Error ? e.name : undefined;
}

const isMissing = (e: unknown) => statusOf(e) === 404 || nameOf(e) === "NoSuchKey" || nameOf(e) === "NotFound";

/**
 * A store may answer a Range request with more than was asked (HTTP lets a server ignore Range
 * and send 200 with the whole object; some S3-compatible stores misread "bytes=0-0"). The body
 * is cut to [start, end] here so every driver returns exactly the requested bytes.
 */
function trimToRange(body: Readable, contentRange: string | undefined, start: number, end: number | undefined): Readable {
  const m = contentRange ? /^bytes (\d+)-(\d+)\/(?:\d+|\*)$/.exec(contentRange) : null;
  const from = m ? Number(m[1]) : 0;
  const to = m ? Number(m[2]) : Number.POSITIVE_INFINITY;
  const wantEnd = end ?? Number.POSITIVE_INFINITY;
  if (from === start && to <= wantEnd) return body;
  if (from > start) {
    body.destroy();
    throw new Error(`the store answered a range from byte ${from} to a request from byte ${start}`);
  }
  let skip = start - from;
  let left = wantEnd - start + 1;
  const cut = new Transform({
    transform(chunk: Buffer, _enc, done) {
      let piece = chunk;
      if (skip > 0) {
        const n = Math.min(skip, piece.length);
        skip -= n;
        piece = piece.subarray(n);
      }
      if (left <= 0 || piece.length === 0) return done();
      if (piece.length > left) piece = piece.subarray(0, left);
      left -= piece.length;
      done(null, piece);
      // Enough read: stop downloading the rest.
      if (left <= 0) {
        this.push(null);
        body.destroy();
      }
    },
  });
  body.on("error", (e) => cut.destroy(e));
  return body.pipe(cut);
}

export function createS3Client(o: S3StorageOptions): S3Client {
  return new S3Client({
    region: o.region,
    ...(o.endpoint ? { endpoint: o.endpoint } : {}),
    forcePathStyle: o.forcePathStyle ?? false,
    ...(o.credentials ? { credentials: o.credentials } : {}),
    // The SDK's default since 2025 adds CRC32 trailers and aws-chunked bodies, which many
    // S3-compatible stores (and the local fake) refuse. Integrity rests on TLS, the SigV4 payload
    // hash of each buffered part, and the SHA-256 recorded at upload.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
}

/**
 * The storage interface over an S3 bucket. Keys are the disk driver's generated keys, used
 * unchanged as object keys; nothing from the user reaches a key.
 */
export function createS3Storage(options: S3StorageOptions, client: S3Client = createS3Client(options)): ObjectStorage {
  const Bucket = options.bucket;
  const partSize = Math.max(options.partSize ?? MIN_PART, MIN_PART);
  const queueSize = options.queueSize ?? 2;

  async function put(body: StorageBody, opts: PutOptions = {}): Promise<StoredObject> {
    const maxBytes = opts.maxBytes ?? Number.POSITIVE_INFINITY;
    if (body instanceof Uint8Array && body.length > maxBytes) throw tooLarge(maxBytes);
    if (opts.signal?.aborted) throw new StorageError("aborted", "The upload was cancelled.");
    const key = newStorageKey();
    const meter = new ByteMeter(maxBytes);
    // The meter errors as soon as the limit is passed; the upload then reads that error, aborts
    // its multipart upload and never completes it, so no object appears. Bodies under one part
    // fail before any request is sent.
    const flowing = pipeline(toNodeReadable(body), meter, opts.signal ? { signal: opts.signal } : {}).then(
      () => null,
      (e: unknown) => e,
    );
    const upload = new Upload({
      client,
      params: { Bucket, Key: key, Body: meter, ContentType: "application/octet-stream" },
      partSize,
      queueSize,
      leavePartsOnError: false,
    });
    try {
      await upload.done();
      const streamError = await flowing;
      if (streamError) throw streamError;
      return { key, size: meter.bytes, sha256: meter.digest() };
    } catch (e) {
      // An upload that failed on its own stops reading; free the source so the pipeline settles.
      meter.destroy();
      await flowing;
      // Belt and braces: an error after completion (never expected) must not leave an orphan.
      await client.send(new DeleteObjectCommand({ Bucket, Key: key })).catch(() => undefined);
      if (meter.overLimit) throw tooLarge(maxBytes);
      if (e instanceof StorageError) throw e;
      if (opts.signal?.aborted || nameOf(e) === "AbortError") {
        throw new StorageError("aborted", "The upload was cancelled.", undefined, { cause: e });
      }
      throw new StorageError("io", "The file could not be stored.", undefined, { cause: e });
    }
  }

  async function get(key: string, range: GetOptions = {}): Promise<Readable> {
    assertStorageKey(key);
    const Range = range.start === undefined && range.end === undefined ? undefined : `bytes=${range.start ?? 0}-${range.end ?? ""}`;
    try {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key, Range }));
      if (!(res.Body instanceof Readable)) throw new Error("the S3 client returned a body that is not a Node stream");
      if (Range === undefined) return res.Body;
      return trimToRange(res.Body, res.ContentRange, range.start ?? 0, range.end);
    } catch (e) {
      if (isMissing(e)) throw notFoundError();
      // The object exists but the range starts past its end: the disk driver yields no bytes.
      if (statusOf(e) === 416 || nameOf(e) === "InvalidRange") return Readable.from([]);
      throw new StorageError("io", "The stored file could not be read.", undefined, { cause: e });
    }
  }

  async function head(key: string): Promise<{ key: string; size: number } | null> {
    assertStorageKey(key);
    try {
      const res = await client.send(new HeadObjectCommand({ Bucket, Key: key }));
      return { key, size: res.ContentLength ?? 0 };
    } catch (e) {
      if (isMissing(e)) return null;
      throw new StorageError("io", "The stored file could not be checked.", undefined, { cause: e });
    }
  }

  async function remove(key: string): Promise<boolean> {
    // S3 answers 204 whether or not the object was there; the interface reports which.
    if ((await head(key)) === null) return false;
    try {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    } catch (e) {
      throw new StorageError("io", "The stored file could not be deleted.", undefined, { cause: e });
    }
    return true;
  }

  async function list(): Promise<string[]> {
    const keys: string[] = [];
    let ContinuationToken: string | undefined;
    do {
      const res = await client.send(new ListObjectsV2Command({ Bucket, ContinuationToken }));
      for (const o of res.Contents ?? []) if (o.Key && isStorageKey(o.Key)) keys.push(o.Key);
      ContinuationToken = res.IsTruncated ? res.NextContinuationToken : undefined;
    } while (ContinuationToken);
    return keys.sort();
  }

  return {
    put,
    get,
    head,
    exists: async (key) => (await head(key)) !== null,
    delete: remove,
    list,
  };
}
