// Dependency check run by the test command: `npm audit` of the shipped (non-dev) dependencies,
// failing on any high or critical advisory. Where the registry's advisory service cannot be
// reached (this build machine's registry answers 405 to the bulk advisory endpoint), it says so
// and checks every installed copy of the packages that matter most against the lowest versions
// with the known fixes (table below), so CI still fails on a known-bad version.
//   tsx scripts/audit-deps.ts [--strict]   (--strict: an unreachable advisory service fails too)
import { execFile } from "node:child_process";
import { readFileSync } from "node:fs";
import { belowFloors, FLOORS } from "./audit-floors";

interface AuditJson {
  metadata?: { vulnerabilities?: Record<string, number> };
  error?: { code?: string; summary?: string };
  message?: string;
}

function npmAudit(): Promise<AuditJson | { unreachable: string }> {
  return new Promise((resolve) => {
    execFile("npm", ["audit", "--omit=dev", "--json"], { timeout: 90_000, maxBuffer: 32 * 1024 * 1024 }, (err, stdout, stderr) => {
      try {
        const j = JSON.parse(stdout) as AuditJson;
        if (j.metadata?.vulnerabilities) return resolve(j);
        return resolve({ unreachable: j.message || j.error?.summary || j.error?.code || "no advisory data in the answer" });
      } catch {
        resolve({ unreachable: (stderr || err?.message || "npm audit printed no JSON").trim().split("\n")[0]! });
      }
    });
  });
}

const strict = process.argv.includes("--strict");
const audit = await npmAudit();
let failed = false;
if ("unreachable" in audit) {
  console.log(`[audit] the advisory service could not be reached (${audit.unreachable}); checking version floors instead`);
  if (strict) failed = true;
} else {
  const v = audit.metadata!.vulnerabilities!;
  console.log(`[audit] npm audit (shipped dependencies): ${v.critical ?? 0} critical, ${v.high ?? 0} high, ${v.moderate ?? 0} moderate, ${v.low ?? 0} low`);
  if ((v.critical ?? 0) + (v.high ?? 0) > 0) failed = true;
}
const lock = JSON.parse(readFileSync("package-lock.json", "utf8")) as Parameters<typeof belowFloors>[0];
const { bad, checked } = belowFloors(lock);
for (const b of bad) console.log(`[audit] ${b}`);
console.log(`[audit] ${checked} installed copies of ${FLOORS.length} watched packages checked against their floors: ${bad.length} below`);
if (bad.length) failed = true;
process.exit(failed ? 1 : 0);
