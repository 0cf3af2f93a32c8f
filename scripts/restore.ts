// Restore a backup set into an EMPTY database and storage folder, checking every file's SHA-256:
//   npx tsx scripts/restore.ts DIR       (writes to DATABASE_URL and STORAGE_DIR)
import path from "node:path";
import { restore } from "@/lib/backup";

const [dir] = process.argv.slice(2);
const url = process.env.DATABASE_URL;
if (!dir || !url) {
  console.error("usage: DATABASE_URL=… STORAGE_DIR=… npx tsx scripts/restore.ts BACKUP_DIR");
  process.exit(2);
}
try {
  const started = Date.now();
  const m = await restore(path.resolve(dir), { databaseUrl: url, storageDir: path.resolve(process.env.STORAGE_DIR ?? ".data/storage") });
  console.log(`[restore] ${m.database} (backup of ${m.createdAt}) and ${m.files.length} files restored in ${Date.now() - started} ms`);
} catch (e) {
  console.error("[restore] failed:", e instanceof Error ? e.message : e);
  process.exit(1);
}
