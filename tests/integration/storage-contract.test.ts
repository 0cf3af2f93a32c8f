import { createHash } from "node:crypto";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { ListMultipartUploadsCommand } from "@aws-sdk/client-s3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDiskStorage } from "@/lib/storage/disk";
import { startFakeS3, type FakeS3 } from "@/lib/storage/fake-s3";
import { createS3Client, createS3Storage } from "@/lib/storage/s3";
import { isStorageKey, newStorageKey, readAll, StorageError, type ObjectStorage } from "@/lib/storage/storage";

// One behaviour, two drivers: every case runs against the disk driver and against the S3 driver
// talking to the local fake bucket (lib/storage/fake-s3.ts). S3_TEST_PORT moves the fake.
const S3_PORT = Number(process.env.S3_TEST_PORT ?? 3441);
const MiB = 1024 * 1024;

interface Subject {
  storage: ObjectStorage;
  /** Half-written uploads still held by the store: disk temp files, S3 multipart uploads. */
  leftovers(): Promise<string[]>;
  close(): Promise<void>;
}

const roots: string[] = [];
async function tempDir(label: string): Promise<string> {
  const dir = await fs.mkdtemp(path.join(os.tmpdir(), `spanproof-${label}-`));
  roots.push(dir);
  return dir;
}
afterAll(async () => {
  await Promise.all(roots.map((r) => fs.rm(r, { recursive: true, force: true })));
});

const drivers: [string, () => Promise<Subject>][] = [
  [
    "disk",
    async () => {
      const rootDir = await tempDir("disk");
      return {
        storage: createDiskStorage({ rootDir }),
        leftovers: async () => fs.readdir(path.join(rootDir, ".tmp")).catch(() => []),
        close: async () => undefined,
      };
    },
  ],
  [
    "s3",
    async () => {
      const fake: FakeS3 = await startFakeS3({ port: S3_PORT, directory: await tempDir("s3"), bucket: "contract-test" });
      const client = createS3Client(fake.storageOptions);
      return {
        storage: createS3Storage(fake.storageOptions, client),
        leftovers: async () => {
          const r = await client.send(new ListMultipartUploadsCommand({ Bucket: fake.bucket }));
          return (r.Uploads ?? []).map((u) => `${u.Key} (${u.UploadId})`);
        },
        close: async () => {
          client.destroy();
          await fake.close();
        },
      };
    },
  ],
];

const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

// Deterministic, not constant: 0..250 repeating, so a dropped or reordered chunk changes the hash.
function pattern(n: number, offset = 0): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(n);
  for (let k = 0; k < n; k++) out[k] = (k + offset) % 251;
  return out;
}

/** `total` bytes of the pattern in `chunk`-byte pieces, counting how many were pulled. */
function counted(total: number, chunk: number) {
  const state = { pulled: 0 };
  async function* gen() {
    for (let at = 0; at < total; at += chunk) {
      const piece = pattern(Math.min(chunk, total - at), at);
      state.pulled += piece.length;
      yield piece;
    }
  }
  return { state, body: gen() };
}

const read = async (s: ObjectStorage, key: string, range?: { start?: number; end?: number }) => readAll(await s.get(key, range));
const errorOf = (p: Promise<unknown>) => p.then(
  () => {
    throw new Error("expected a rejection");
  },
  (e: unknown) => e,
);

// The disk driver's answer for an absent key, which the S3 driver must repeat word for word.
let diskMissing: StorageError;
beforeAll(async () => {
  const disk = createDiskStorage({ rootDir: await tempDir("reference") });
  diskMissing = (await errorOf(disk.get(newStorageKey()))) as StorageError;
});

describe.each(drivers)("storage contract: %s driver", (_name, make) => {
  let subject: Subject;
  let s: ObjectStorage;
  beforeAll(async () => {
    subject = await make();
    s = subject.storage;
  });
  afterAll(() => subject.close());

  it("writes and reads back every body kind, with size and SHA-256 computed on the way", async () => {
    const bytes = pattern(300_000);
    const bodies = [
      bytes,
      Readable.from([bytes.subarray(0, 100_000), bytes.subarray(100_000)]),
      new Blob([bytes]).stream(),
      (async function* () {
        yield bytes.subarray(0, 7);
        yield bytes.subarray(7);
      })(),
    ];
    for (const body of bodies) {
      const stored = await s.put(body, { maxBytes: bytes.length });
      expect(isStorageKey(stored.key)).toBe(true);
      expect(stored).toMatchObject({ size: bytes.length, sha256: sha256(bytes) });
      expect(Buffer.from(await read(s, stored.key)).equals(Buffer.from(bytes))).toBe(true);
      expect(await s.head(stored.key)).toEqual({ key: stored.key, size: bytes.length });
      expect(await s.exists(stored.key)).toBe(true);
      expect(await s.list()).toContain(stored.key);
    }
  });

  it("stores an empty body and a body of several 5 MiB parts", async () => {
    const empty = await s.put(new Uint8Array(0));
    expect(empty).toMatchObject({ size: 0, sha256: sha256(new Uint8Array(0)) });
    expect((await read(s, empty.key)).length).toBe(0);

    const total = 11 * MiB + 12_345; // three parts on S3: 5 MiB, 5 MiB and the rest
    const { body } = counted(total, 256 * 1024);
    const stored = await s.put(body, { maxBytes: 60 * MiB });
    const expected = pattern(total);
    expect(stored).toMatchObject({ size: total, sha256: sha256(expected) });
    const back = await read(s, stored.key);
    expect(back.length).toBe(total);
    expect(sha256(back)).toBe(sha256(expected));
  });

  it("reads byte ranges with HTTP semantics (first and last byte inclusive)", async () => {
    const bytes = pattern(10_000);
    const { key } = await s.put(bytes);
    const slice = (a: number, b: number) => Buffer.from(bytes.subarray(a, b + 1));
    expect(Buffer.from(await read(s, key, { start: 0, end: 0 })).equals(slice(0, 0))).toBe(true);
    expect(Buffer.from(await read(s, key, { start: 1234, end: 5677 })).equals(slice(1234, 5677))).toBe(true);
    expect(Buffer.from(await read(s, key, { start: 9_990 })).equals(slice(9_990, 9_999))).toBe(true);
    expect(Buffer.from(await read(s, key, { end: 99 })).equals(slice(0, 99))).toBe(true);
    expect(Buffer.from(await read(s, key, { start: 9_999, end: 9_999 })).equals(slice(9_999, 9_999))).toBe(true);
    // An end past the last byte is cut to it; a start past it yields nothing.
    expect(Buffer.from(await read(s, key, { start: 9_000, end: 20_000 })).equals(slice(9_000, 9_999))).toBe(true);
    expect((await read(s, key, { start: 10_000 })).length).toBe(0);
  });

  it("deletes, and reports whether there was anything to delete", async () => {
    const { key } = await s.put(pattern(2_000));
    expect(await s.delete(key)).toBe(true);
    expect(await s.delete(key)).toBe(false);
    expect(await s.exists(key)).toBe(false);
    expect(await s.head(key)).toBeNull();
    expect(await s.list()).not.toContain(key);
    await expect(s.get(key)).rejects.toMatchObject({ code: "not_found" });
  });

  it("answers a missing key with the disk driver's not-found error", async () => {
    const key = newStorageKey();
    const err = await errorOf(s.get(key));
    expect(err).toBeInstanceOf(StorageError);
    expect(diskMissing).toBeInstanceOf(StorageError);
    expect({ code: (err as StorageError).code, message: (err as StorageError).message }).toEqual({ code: "not_found", message: diskMissing.message });
    const ranged = await errorOf(s.get(key, { start: 10, end: 20 }));
    expect((ranged as StorageError).code).toBe("not_found");
    expect(await s.head(key)).toBeNull();
    expect(await s.exists(key)).toBe(false);
    expect(await s.delete(key)).toBe(false);
  });

  it.each([["../../etc/passwd"], ["ab/cd/../../../etc/passwd"], ["foundation-plan.pdf"], ["00/00/abcd1234-1234-4123-8123-123456789abc"]])(
    "refuses the key %s before asking the store",
    async (key) => {
      for (const call of [s.get(key), s.head(key), s.exists(key), s.delete(key)]) {
        await expect(call).rejects.toMatchObject({ name: "StorageError", code: "invalid_key" });
      }
    },
  );

  it("refuses an over-size body while streaming and leaves no object and no half-written upload", async () => {
    const before = await s.list();
    const limit = 6 * MiB; // past the first 5 MiB part, so the S3 driver has a multipart upload to abort
    const source = counted(64 * MiB, 256 * 1024);
    const err = await errorOf(s.put(source.body, { maxBytes: limit }));
    expect(err).toBeInstanceOf(StorageError);
    expect(err).toMatchObject({ code: "too_large", limit });
    expect((err as Error).message).toMatch(/larger than the 6\.3 MB limit/); // 6 MiB = 6.29 MB
    // It stopped reading soon after the limit: the limit plus at most the parts in flight.
    expect(source.state.pulled).toBeGreaterThan(limit);
    expect(source.state.pulled).toBeLessThan(limit + 12 * MiB);
    expect(await s.list()).toEqual(before);
    expect(await subject.leftovers()).toEqual([]);

    // Under one part: refused before anything reaches the store.
    const small = counted(4_001, 1_000);
    await expect(s.put(small.body, { maxBytes: 4_000 })).rejects.toMatchObject({ code: "too_large", limit: 4_000 });
    await expect(s.put(pattern(4_001), { maxBytes: 4_000 })).rejects.toMatchObject({ code: "too_large" });
    expect(await s.list()).toEqual(before);
    expect(await subject.leftovers()).toEqual([]);
  });

  it("a cancelled upload is reported as cancelled and leaves nothing", async () => {
    const before = await s.list();
    const controller = new AbortController();
    const source = counted(32 * MiB, 256 * 1024);
    async function* cancelling() {
      for await (const piece of source.body) {
        if (source.state.pulled > 7 * MiB) controller.abort();
        yield piece;
      }
    }
    await expect(s.put(cancelling(), { signal: controller.signal })).rejects.toMatchObject({ code: "aborted" });
    expect(source.state.pulled).toBeLessThan(32 * MiB);
    expect(await s.list()).toEqual(before);
    expect(await subject.leftovers()).toEqual([]);
  });

  it("keeps concurrent writes of the same content apart: own keys, same hash, every copy whole", async () => {
    const bytes = pattern(5 * MiB + 777); // two parts each on S3
    const n = 6;
    const stored = await Promise.all(Array.from({ length: n }, () => s.put(Readable.from([bytes]), { maxBytes: 60 * MiB })));
    expect(new Set(stored.map((o) => o.key)).size).toBe(n);
    for (const o of stored) expect(o).toMatchObject({ size: bytes.length, sha256: sha256(bytes) });
    const listed = await s.list();
    for (const o of stored) expect(listed).toContain(o.key);
    const copies = await Promise.all(stored.map((o) => read(s, o.key)));
    for (const c of copies) expect(sha256(c)).toBe(sha256(bytes));
    // Deleting one copy leaves the others.
    expect(await s.delete(stored[0]!.key)).toBe(true);
    for (const o of stored.slice(1)) expect(await s.exists(o.key)).toBe(true);
    expect(await subject.leftovers()).toEqual([]);
  });
});
