import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseEnv } from "@/lib/env";
import { startFakeS3, type FakeS3 } from "@/lib/storage/fake-s3";
import { storageFromEnv } from "@/lib/storage/from-env";
import { readAll } from "@/lib/storage/storage";

// Choosing the driver from the environment: the S3 settings are checked at start with messages
// naming the variable, and the driver built from them really reaches the bucket.
const base = {
  DATABASE_URL: "mysql://u:p@127.0.0.1:3307/spanproof",
  AUTH_SECRET: "x".repeat(40),
  APP_URL: "http://127.0.0.1:3000",
};
const s3 = {
  ...base,
  STORAGE_DRIVER: "s3",
  S3_BUCKET: "larkspur-plans",
  S3_REGION: "us-west-2",
};

describe("storage settings", () => {
  it("defaults to the disk driver and needs no S3 settings for it", () => {
    const e = parseEnv(base);
    expect(e.STORAGE_DRIVER).toBe("disk");
    expect(e.S3_FORCE_PATH_STYLE).toBe(false);
  });

  it("accepts a bucket and region alone (credentials from the SDK's default chain) or with a key pair", () => {
    const alone = parseEnv(s3);
    expect(alone).toMatchObject({ STORAGE_DRIVER: "s3", S3_BUCKET: "larkspur-plans", S3_REGION: "us-west-2" });
    expect(alone.S3_ACCESS_KEY_ID).toBeUndefined();
    const full = parseEnv({ ...s3, S3_ENDPOINT: "http://127.0.0.1:4569", S3_ACCESS_KEY_ID: "AKIDLARKSPUR", S3_SECRET_ACCESS_KEY: "secret", S3_FORCE_PATH_STYLE: "true" });
    expect(full).toMatchObject({ S3_ENDPOINT: "http://127.0.0.1:4569", S3_FORCE_PATH_STYLE: true });
    // Blank lines in .env count as unset.
    expect(parseEnv({ ...s3, S3_ENDPOINT: "", S3_ACCESS_KEY_ID: "", S3_SECRET_ACCESS_KEY: "" }).S3_ENDPOINT).toBeUndefined();
  });

  it.each([
    ["an unknown driver", { ...base, STORAGE_DRIVER: "ftp" }, /STORAGE_DRIVER: must be "disk" or "s3"/],
    ["s3 without a bucket", { ...s3, S3_BUCKET: undefined }, /S3_BUCKET: is required when STORAGE_DRIVER=s3/],
    ["s3 without a region", { ...s3, S3_REGION: undefined }, /S3_REGION: is required when STORAGE_DRIVER=s3/],
    ["a key id without its secret", { ...s3, S3_ACCESS_KEY_ID: "AKIDLARKSPUR" }, /S3_SECRET_ACCESS_KEY: is required together with S3_ACCESS_KEY_ID/],
    ["a secret without its key id", { ...s3, S3_SECRET_ACCESS_KEY: "secret" }, /S3_ACCESS_KEY_ID: is required together with S3_SECRET_ACCESS_KEY/],
    ["a bucket name with capitals", { ...s3, S3_BUCKET: "Larkspur_Plans" }, /S3_BUCKET: must be a bucket name/],
    ["an endpoint that is not a URL", { ...s3, S3_ENDPOINT: "127.0.0.1:4569" }, /S3_ENDPOINT: must be the store's base URL/],
    ["path style neither true nor false", { ...s3, S3_FORCE_PATH_STYLE: "yes" }, /S3_FORCE_PATH_STYLE: must be "true" or "false"/],
  ])("refuses %s, naming the variable", (_label, source, message) => {
    expect(() => parseEnv(source)).toThrow(message);
  });

  it("reports every missing S3 setting at once", () => {
    const err = (() => {
      try {
        parseEnv({ ...base, STORAGE_DRIVER: "s3" });
      } catch (e) {
        return e as Error;
      }
      throw new Error("expected the environment to be refused");
    })();
    expect(err.message).toMatch(/S3_BUCKET: is required/);
    expect(err.message).toMatch(/S3_REGION: is required/);
  });
});

describe("storageFromEnv", () => {
  const PORT = Number(process.env.S3_TEST_PORT ?? 3441);
  let fake: FakeS3;
  let dir: string;
  beforeAll(async () => {
    dir = await fs.mkdtemp(path.join(os.tmpdir(), "spanproof-s3-config-"));
    fake = await startFakeS3({ port: PORT, directory: path.join(dir, "bucket"), bucket: "config-test" });
  });
  afterAll(async () => {
    await fake?.close();
    await fs.rm(dir, { recursive: true, force: true });
  });

  it("builds the S3 driver from the variables and it reaches the bucket; the disk driver writes under STORAGE_DIR", async () => {
    const bytes = new TextEncoder().encode("Larkspur Falls plan set, sheet S-101");
    const o = fake.storageOptions;
    const viaS3 = storageFromEnv(
      parseEnv({
        ...s3,
        S3_BUCKET: o.bucket,
        S3_REGION: o.region,
        S3_ENDPOINT: o.endpoint,
        S3_ACCESS_KEY_ID: o.credentials.accessKeyId,
        S3_SECRET_ACCESS_KEY: o.credentials.secretAccessKey,
        S3_FORCE_PATH_STYLE: "true",
      }),
    );
    const a = await viaS3.put(bytes);
    expect(Buffer.from(await readAll(await viaS3.get(a.key))).toString()).toBe("Larkspur Falls plan set, sheet S-101");
    expect(await viaS3.list()).toEqual([a.key]);

    const diskDir = path.join(dir, "disk");
    const viaDisk = storageFromEnv(parseEnv({ ...base, STORAGE_DIR: diskDir }));
    const b = await viaDisk.put(bytes);
    expect((await fs.stat(path.join(diskDir, ...b.key.split("/")))).size).toBe(bytes.length);
    // Two drivers, two stores: neither sees the other's object.
    expect(await viaDisk.exists(a.key)).toBe(false);
    expect(await viaS3.exists(b.key)).toBe(false);
  });

  // The fake checks the key id only (s3rver does not verify SigV4 signatures), so a wrong key id stands in for bad credentials.
  it("credentials the store refuses are a storage error, not a silent disk fallback", async () => {
    const o = fake.storageOptions;
    const wrong = storageFromEnv(
      parseEnv({ ...s3, S3_BUCKET: o.bucket, S3_REGION: o.region, S3_ENDPOINT: o.endpoint, S3_ACCESS_KEY_ID: "AKIDUNKNOWN", S3_SECRET_ACCESS_KEY: "secret", S3_FORCE_PATH_STYLE: "true" }),
    );
    const before = await fs.readdir(dir);
    await expect(wrong.put(new Uint8Array([1, 2, 3]))).rejects.toMatchObject({ name: "StorageError", code: "io" });
    await expect(wrong.list()).rejects.toThrow();
    expect(await fs.readdir(dir)).toEqual(before);
  });
});
