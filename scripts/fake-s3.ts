// Runs the local fake of an S3 bucket until stopped (see lib/storage/fake-s3.ts): objects in
// S3_FAKE_DIR (default .data/s3), listening on loopback S3_FAKE_PORT (default 4569).
//   npm run fake:s3     then run the app with the S3_* lines it prints
import { startFakeS3 } from "@/lib/storage/fake-s3";
import { runLocalFake } from "./run-local-fake";

const port = Number(process.env.S3_FAKE_PORT ?? 4569);
const directory = process.env.S3_FAKE_DIR ?? ".data/s3";
const bucket = process.env.S3_BUCKET ?? "spanproof-local";

if (!Number.isInteger(port) || port < 1 || port > 65535) {
  console.error(`[s3] S3_FAKE_PORT must be a port number, got "${process.env.S3_FAKE_PORT}"`);
  process.exit(2);
}
await runLocalFake("s3", "S3_FAKE_PORT", async () => {
  const fake = await startFakeS3({ port, directory, bucket });
  const o = fake.storageOptions;
  console.log(`[s3] local fake S3 at ${fake.url}, bucket "${bucket}", objects in ${directory}. Run the app with:`);
  console.log(
    [
      "STORAGE_DRIVER=s3",
      `S3_BUCKET=${o.bucket}`,
      `S3_ENDPOINT=${o.endpoint}`,
      `S3_REGION=${o.region}`,
      `S3_ACCESS_KEY_ID=${o.credentials.accessKeyId}`,
      `S3_SECRET_ACCESS_KEY=${o.credentials.secretAccessKey}`,
      "S3_FORCE_PATH_STYLE=true",
    ].join("\n"),
  );
  return fake;
});
