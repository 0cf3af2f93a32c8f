import "server-only";
import type { Env } from "@/lib/env";
import { createDiskStorage } from "@/lib/storage/disk";
import { createS3Storage } from "@/lib/storage/s3";
import type { ObjectStorage } from "@/lib/storage/storage";

type StorageEnv = Pick<
  Env,
  "STORAGE_DRIVER" | "STORAGE_DIR" | "S3_BUCKET" | "S3_ENDPOINT" | "S3_REGION" | "S3_ACCESS_KEY_ID" | "S3_SECRET_ACCESS_KEY" | "S3_FORCE_PATH_STYLE"
>;

/** The driver STORAGE_DRIVER names, configured from the validated environment. */
export function storageFromEnv(e: StorageEnv): ObjectStorage {
  if (e.STORAGE_DRIVER === "disk") return createDiskStorage({ rootDir: e.STORAGE_DIR });
  // lib/env.ts has already required these for the s3 driver; this guards a hand-built object.
  if (!e.S3_BUCKET || !e.S3_REGION) throw new Error("STORAGE_DRIVER=s3 needs S3_BUCKET and S3_REGION (see .env.example).");
  return createS3Storage({
    bucket: e.S3_BUCKET,
    region: e.S3_REGION,
    endpoint: e.S3_ENDPOINT,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY } : undefined,
  });
}
