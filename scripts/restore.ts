// Restore a backup set into an EMPTY database and storage folder, checking every file's SHA-256:
//   npx tsx scripts/restore.ts DIR       (writes to MIGRATION_DATABASE_URL, else DATABASE_URL, and STORAGE_DIR)
import path from "node:path";
import mysql from "mysql2/promise";
import { restore } from "@/lib/backup";
import { accountFromUrl, grantAppAccess } from "@/db/grants";

const [dir] = process.argv.slice(2);
// The owner account writes; grants live outside the dump, so the app account gets them again below.
const appUrl = process.env.DATABASE_URL;
const url = process.env.MIGRATION_DATABASE_URL || process.env.DATABASE_URL;
if (!dir || !url) {
  console.error("usage: DATABASE_URL=… STORAGE_DIR=… npx tsx scripts/restore.ts BACKUP_DIR");
  process.exit(2);
}
try {
  const started = Date.now();
  const m = await restore(path.resolve(dir), { databaseUrl: url, storageDir: path.resolve(process.env.STORAGE_DIR ?? ".data/storage") });
  console.log(`[restore] ${m.database} (backup of ${m.createdAt}) and ${m.files.length} files restored in ${Date.now() - started} ms`);
  if (appUrl && accountFromUrl(appUrl).user !== accountFromUrl(url).user) {
    const conn = await mysql.createConnection({ uri: url });
    try {
      await grantAppAccess(conn, accountFromUrl(appUrl));
      console.log(`[restore] table grants for ${accountFromUrl(appUrl).user} applied`);
    } finally {
      await conn.end();
    }
  }
} catch (e) {
  console.error("[restore] failed:", e instanceof Error ? e.message : e);
  process.exit(1);
}
