import { createHash } from "node:crypto";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { GetObjectCommand, HeadObjectCommand, ListMultipartUploadsCommand, S3Client } from "@aws-sdk/client-s3";
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import { documents } from "@/db/schema";
import { UPLOAD_LIMITS } from "@/lib/applications/documents";
import { createApplication } from "@/lib/applications/service";
import { backup, restore } from "@/lib/backup";
import { startFakeS3, type FakeS3 } from "@/lib/storage/fake-s3";
import { createS3Client } from "@/lib/storage/s3";
import { makeDrawingSet, makeRenamedPng } from "../fixtures/pdf/make";
import { makeUser, resetDb } from "./db-helpers";

// The application's own upload and download paths with STORAGE_DRIVER=s3: the real route
// handlers (only the session is stubbed), the service, the S3 driver, the local fake bucket.
// STORAGE_DIR points at an empty folder that must stay empty.
const S3_PORT = Number(process.env.S3_TEST_PORT ?? 3441);
const BUCKET = "upload-test";
const diskDir = vi.hoisted(() => `${process.env.TMPDIR ?? "/tmp"}/spanproof-s3-upload-disk-${process.pid}`);
vi.hoisted(() => {
  const port = Number(process.env.S3_TEST_PORT ?? 3441);
  Object.assign(process.env, {
    STORAGE_DIR: diskDir,
    STORAGE_DRIVER: "s3",
    S3_BUCKET: "upload-test",
    S3_ENDPOINT: `http://127.0.0.1:${port}`,
    S3_REGION: "us-east-1",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    S3_FORCE_PATH_STYLE: "true",
  });
});
const session = vi.hoisted(() => ({ uid: 0 }));
vi.mock("@/lib/auth/config", () => ({ auth: async () => (session.uid ? { uid: session.uid, sv: 1 } : null) }));
const uploadRoute = await import("@/app/api/applications/[id]/documents/route");
const fileRoute = await import("@/app/api/documents/[id]/file/route");

const base = process.env.APP_URL ?? "http://127.0.0.1:3100";
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** The body as a browser sends it: a stream in 64 kB pieces, so the driver never sees it whole. */
function streamOf(bytes: Uint8Array | (() => AsyncGenerator<Uint8Array>)): ReadableStream<Uint8Array> {
  const source = typeof bytes === "function" ? bytes() : (async function* () {
    for (let at = 0; at < bytes.length; at += 65_536) yield bytes.subarray(at, at + 65_536);
  })();
  return new ReadableStream({
    async pull(c) {
      const next = await source.next();
      if (next.done) c.close();
      else c.enqueue(next.value);
    },
  });
}

async function upload(applicationId: number, name: string, body: ReadableStream<Uint8Array>) {
  const req = new NextRequest(`${base}/api/applications/${applicationId}/documents?kind=drawings`, {
    method: "POST",
    headers: { origin: base, "content-type": "application/pdf", "x-file-name": encodeURIComponent(name) },
    body,
    // A streamed request body needs half-duplex (fetch standard); the init type does not list it yet.
    duplex: "half",
  } as ConstructorParameters<typeof NextRequest>[1]);
  const res = await uploadRoute.POST(req, { params: Promise.resolve({ id: String(applicationId) }) });
  return { status: res.status, body: (await res.json()) as { document?: { id: number; pageCount: number }; error?: { message: string } } };
}

async function download(documentId: number, range?: string) {
  const req = new NextRequest(`${base}/api/documents/${documentId}/file`, { headers: range ? { range } : {} });
  const res = await fileRoute.GET(req, { params: Promise.resolve({ id: String(documentId) }) });
  return { status: res.status, headers: res.headers, bytes: new Uint8Array(await res.arrayBuffer()) };
}

let fake: FakeS3;
let s3: S3Client;
let fakeDir: string;
beforeAll(async () => {
  fakeDir = await fs.mkdtemp(path.join(os.tmpdir(), "spanproof-s3-upload-"));
  fake = await startFakeS3({ port: S3_PORT, directory: fakeDir, bucket: BUCKET });
  s3 = createS3Client(fake.storageOptions);
  await fs.rm(diskDir, { recursive: true, force: true });
  // A storage object built by an earlier file in this worker would be the disk driver.
  delete (globalThis as { __spanproofStorage?: unknown }).__spanproofStorage;
});
afterAll(async () => {
  s3?.destroy();
  await fake?.close();
  await Promise.all([fs.rm(fakeDir, { recursive: true, force: true }), fs.rm(diskDir, { recursive: true, force: true })]);
});
beforeEach(async () => {
  await resetDb();
  session.uid = 0;
});

async function bucketKeys(): Promise<string[]> {
  const { storage } = await import("@/lib/applications/documents");
  return storage().list();
}
async function pendingUploads(): Promise<number> {
  return ((await s3.send(new ListMultipartUploadsCommand({ Bucket: BUCKET }))).Uploads ?? []).length;
}
const diskFiles = async () => (await fs.readdir(diskDir, { recursive: true }).catch(() => [])).length;

async function draft() {
  const applicant = { ...(await makeUser("applicant")), firmId: null };
  const app = await createApplication(db(), applicant, {
    workDescription: "Covered porch with a glulam header over the entry",
    siteAddress: "77 Tamarack Court, Larkspur Falls",
    parcelNumber: "114-305-12",
    occupancyGroup: "R-3",
    constructionType: "VB",
    valuation: 6_500_000,
    dporName: "Mara Finch, PE",
    dporLicence: "PE-40388",
  });
  return { applicant, app };
}

describe("uploads and downloads with STORAGE_DRIVER=s3", () => {
  it("streams a real PDF into the bucket and serves it back whole and by byte range", async () => {
    const { applicant, app } = await draft();
    const before = await bucketKeys();
    const pdf = await makeDrawingSet({ sheets: [{ number: "S-001", title: "GENERAL NOTES" }, { number: "S-101", title: "FOUNDATION PLAN" }, { number: "S-201", title: "ROOF FRAMING PLAN" }] });
    session.uid = applicant.id;
    const up = await upload(app.id, "porch-structural.pdf", streamOf(pdf));
    expect(up.status).toBe(201);
    expect(up.body.document?.pageCount).toBe(3);

    const [row] = await db().select().from(documents).where(eq(documents.id, up.body.document!.id));
    expect(row).toMatchObject({ byteSize: pdf.length, sha256: sha256(pdf) });
    // The object is in the bucket under the generated key, with the same bytes; nothing went to disk.
    const head = await s3.send(new HeadObjectCommand({ Bucket: BUCKET, Key: row!.storageKey }));
    expect(head.ContentLength).toBe(pdf.length);
    const raw = await s3.send(new GetObjectCommand({ Bucket: BUCKET, Key: row!.storageKey }));
    expect(sha256(await raw.Body!.transformToByteArray())).toBe(sha256(pdf));
    expect(await bucketKeys()).toEqual([...before, row!.storageKey].sort());
    expect(await diskFiles()).toBe(0);

    const whole = await download(row!.id);
    expect(whole.status).toBe(200);
    expect(whole.headers.get("content-length")).toBe(String(pdf.length));
    expect(sha256(whole.bytes)).toBe(sha256(pdf));

    // RFC 9110 §14.1.2: first and last byte inclusive, then the suffix form.
    const part = await download(row!.id, "bytes=100-1099");
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 100-1099/${pdf.length}`);
    expect(Buffer.from(part.bytes).equals(Buffer.from(pdf.subarray(100, 1100)))).toBe(true);
    const one = await download(row!.id, "bytes=0-0");
    expect(Buffer.from(one.bytes).equals(Buffer.from(pdf.subarray(0, 1)))).toBe(true);
    const tail = await download(row!.id, "bytes=-500");
    expect(tail.headers.get("content-range")).toBe(`bytes ${pdf.length - 500}-${pdf.length - 1}/${pdf.length}`);
    expect(Buffer.from(tail.bytes).equals(Buffer.from(pdf.subarray(pdf.length - 500)))).toBe(true);
    expect((await download(row!.id, `bytes=${pdf.length}-`)).status).toBe(416);

    // Another applicant gets "not found", as for a document that does not exist.
    const stranger = await makeUser("applicant");
    session.uid = stranger.id;
    expect((await download(row!.id, "bytes=0-99")).status).toBe(404);
  });

  it("a refused file (a PNG named .pdf) leaves no object in the bucket", async () => {
    const { applicant, app } = await draft();
    session.uid = applicant.id;
    const before = await bucketKeys();
    const up = await upload(app.id, "photo.pdf", streamOf(makeRenamedPng()));
    expect(up.status).toBe(422);
    expect(up.body.error?.message).toMatch(/not a PDF/);
    expect(await db().select().from(documents)).toHaveLength(0);
    expect(await bucketKeys()).toEqual(before);
  });

  it("an over-size upload is refused while streaming: no row, no object, no parts left in the bucket", async () => {
    const { applicant, app } = await draft();
    session.uid = applicant.id;
    const before = await bucketKeys();
    const total = 70 * 1024 * 1024;
    let sent = 0;
    const up = await upload(
      app.id,
      "huge.pdf",
      streamOf(async function* () {
        const chunk = new Uint8Array(1024 * 1024);
        while (sent < total) {
          sent += chunk.length;
          yield chunk;
        }
      }),
    );
    expect(up.status).toBe(422);
    expect(up.body.error?.message).toMatch(/larger than the/);
    // Read up to the limit and not much past it: at most the parts in flight (2 × 5 MiB).
    expect(sent).toBeGreaterThan(UPLOAD_LIMITS.maxBytes);
    expect(sent).toBeLessThan(UPLOAD_LIMITS.maxBytes + 12 * 1024 * 1024);
    expect(await db().select().from(documents)).toHaveLength(0);
    expect(await bucketKeys()).toEqual(before);
    expect(await pendingUploads()).toBe(0);
    expect(await diskFiles()).toBe(0);
  });
});

describe("backup and restore with STORAGE_DRIVER=s3", () => {
  it("refuse with a message that says where the files are and how to protect them, writing nothing", async () => {
    const dir = path.join(fakeDir, "backup-set");
    const target = { databaseUrl: process.env.DATABASE_URL!, storageDir: diskDir };
    const message = /refused: STORAGE_DRIVER=s3 keeps the uploaded files in an object-storage bucket.*versioning and replication.*Nothing was written/;
    await expect(backup(target, dir)).rejects.toThrow(message);
    await expect(fs.stat(dir)).rejects.toMatchObject({ code: "ENOENT" });
    await expect(restore(dir, target)).rejects.toThrow(/^Restore refused: STORAGE_DRIVER=s3/);
    // The same set with the disk driver named explicitly gets past the check (and fails on the missing set instead).
    await expect(restore(dir, { ...target, storageDriver: "disk" })).rejects.toThrow(/ENOENT/);
  });
});
