// A local stand-in for an S3 bucket, for development (scripts/fake-s3.ts) and tests: s3rver
// (a file-system backed fake of the S3 REST API) behind a small front that adds the two calls
// s3rver 3.7 lacks and the storage driver relies on: AbortMultipartUpload (an over-size upload
// must leave no parts behind) and ListMultipartUploads (so tests can prove it did).
// Not for production: s3rver checks the access key id but not SigV4 signatures, and lets
// unsigned requests through; it listens on loopback only.
import { mkdir, readdir, readFile, rm, stat } from "node:fs/promises";
import http from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import S3rver from "s3rver";

/** s3rver's fixed credentials; it refuses signatures made with any other pair. */
export const FAKE_S3_CREDENTIALS = { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" } as const;
export const FAKE_S3_REGION = "us-east-1";

export interface FakeS3Options {
  port: number;
  /** Where objects live on disk; relative paths resolve against the working directory. */
  directory: string;
  /** Created at start if missing. */
  bucket: string;
  host?: string;
}

export interface FakeS3 {
  url: string;
  bucket: string;
  /** Options for createS3Storage / the S3_* variables. */
  storageOptions: { bucket: string; region: string; endpoint: string; forcePathStyle: true; credentials: { accessKeyId: string; secretAccessKey: string } };
  close(): Promise<void>;
}

// s3rver keeps each multipart upload in <directory>/<bucket>/._S3rver_uploads/<uploadId>/.
const UPLOADS = "._S3rver_uploads";
const UPLOAD_ID = /^[0-9a-f]{32}$/;
const BUCKET = /^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/;

const xml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");

function s3Error(res: http.ServerResponse, status: number, code: string, message: string): void {
  res.writeHead(status, { "content-type": "application/xml" });
  res.end(`<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${code}</Code><Message>${xml(message)}</Message></Error>`);
}

export async function startFakeS3(o: FakeS3Options): Promise<FakeS3> {
  if (!BUCKET.test(o.bucket)) throw new Error(`fake S3: "${o.bucket}" is not a valid bucket name (3–63 of a-z, 0-9, "." and "-")`);
  const directory = path.resolve(o.directory);
  await mkdir(directory, { recursive: true });
  const host = o.host ?? "127.0.0.1";
  const s3rver = new S3rver({ directory, silent: true, configureBuckets: [{ name: o.bucket }], vhostBuckets: false });
  await s3rver.configureBuckets();
  const handle = s3rver.callback();

  async function abortUpload(bucket: string, uploadId: string, res: http.ServerResponse): Promise<void> {
    const dir = path.join(directory, bucket, UPLOADS, uploadId);
    if (!UPLOAD_ID.test(uploadId) || !(await stat(dir).catch(() => null))) {
      s3Error(res, 404, "NoSuchUpload", "The specified multipart upload does not exist.");
      return;
    }
    await rm(dir, { recursive: true, force: true });
    res.writeHead(204).end();
  }

  async function listUploads(bucket: string, res: http.ServerResponse): Promise<void> {
    const root = path.join(directory, bucket, UPLOADS);
    const ids = (await readdir(root).catch(() => [] as string[])).filter((id) => UPLOAD_ID.test(id)).sort();
    const uploads: string[] = [];
    for (const id of ids) {
      const key = await readFile(path.join(root, id, "key"), "utf8").catch(() => null);
      const st = await stat(path.join(root, id)).catch(() => null);
      if (key !== null && st) uploads.push(`<Upload><Key>${xml(key)}</Key><UploadId>${id}</UploadId><Initiated>${st.birthtime.toISOString()}</Initiated></Upload>`);
    }
    res.writeHead(200, { "content-type": "application/xml" });
    res.end(
      `<?xml version="1.0" encoding="UTF-8"?>\n<ListMultipartUploadsResult xmlns="http://s3.amazonaws.com/doc/2006-03-01/">` +
        `<Bucket>${xml(bucket)}</Bucket><MaxUploads>1000</MaxUploads><IsTruncated>false</IsTruncated>${uploads.join("")}</ListMultipartUploadsResult>`,
    );
  }

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://fake-s3.invalid");
    const [, bucket = "", ...rest] = url.pathname.split("/");
    const signedByUs = (req.headers.authorization ?? "").includes(`Credential=${FAKE_S3_CREDENTIALS.accessKeyId}/`);
    const ours = (req.method === "DELETE" && rest.length > 0 && url.searchParams.has("uploadId")) || (req.method === "GET" && rest.join("") === "" && url.searchParams.has("uploads"));
    if (!ours) {
      handle(req, res);
      return;
    }
    if (!signedByUs) {
      s3Error(res, 403, "InvalidAccessKeyId", "The AWS Access Key Id you provided does not exist in our records.");
      return;
    }
    if (bucket !== o.bucket) {
      s3Error(res, 404, "NoSuchBucket", "The specified bucket does not exist.");
      return;
    }
    const work = req.method === "DELETE" ? abortUpload(bucket, url.searchParams.get("uploadId") ?? "", res) : listUploads(bucket, res);
    work.catch((e: unknown) => s3Error(res, 500, "InternalError", e instanceof Error ? e.message : String(e)));
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(o.port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${host}:${port}`;
  return {
    url,
    bucket: o.bucket,
    storageOptions: { bucket: o.bucket, region: FAKE_S3_REGION, endpoint: url, forcePathStyle: true, credentials: { ...FAKE_S3_CREDENTIALS } },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
