// Back up the database and the stored files as one set:
//   npx tsx scripts/backup.ts [DIR]      (default .data/backups/<UTC timestamp>; reads MIGRATION_DATABASE_URL (else DATABASE_URL), STORAGE_DIR)
import path from "node:path";
import { backup } from "@/lib/backup";

// The owner account: the app account may not read every table a full backup needs.
const url = process.env.MIGRATION_DATABASE_URL || process.env.DATABASE_URL;
if (!url) {
  console.error("[backup] DATABASE_URL is not set (source .env first)");
  process.exit(1);
}
const dir = path.resolve(process.argv[2] ?? `.data/backups/${new Date().toISOString().replace(/[:.]/g, "-")}`);
try {
  const m = await backup({ databaseUrl: url, storageDir: path.resolve(process.env.STORAGE_DIR ?? ".data/storage") }, dir);
  console.log(`[backup] ${m.database} and ${m.files.length} files → ${dir}`);
} catch (e) {
  console.error("[backup] failed:", e instanceof Error ? e.message : e);
  process.exit(1);
}
