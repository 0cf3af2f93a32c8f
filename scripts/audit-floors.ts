// The lowest versions with known fixes for the packages that matter most, and the check of every
// installed copy in the lockfile against them (used by scripts/audit-deps.ts).
import semver from "semver";

/** Lowest safe version per package, with the advisory that sets it (from the project security notes, Sept. 2026). */
export const FLOORS: { name: string; min: string; why: string }[] = [
  { name: "next", min: "16.3.3", why: "GHSA-2xp9-vwfh-vxw4 (AVIF RCE) and the July 2026 proxy-bypass fixes (16.2.11)" },
  { name: "react", min: "19.2.3", why: "CVE-2025-55182 RSC RCE; CVE-2025-55184/67779 DoS" },
  { name: "react-dom", min: "19.2.3", why: "same React release line as react" },
  { name: "react-server-dom-webpack", min: "19.2.3", why: "CVE-2025-55182 Flight deserialization" },
  { name: "pdfjs-dist", min: "6.2.108", why: "CVE-2026-16633 / GHSA-hq66-cqwq-w95j script execution" },
  { name: "nodemailer", min: "9.1.1", why: "GHSA-2x7j-588g-ccc2 addressparser DoS (9.1.0), GHSA-p6gq-j5cr-w38f (9.0.1)" },
  { name: "mysql2", min: "3.9.8", why: "CVE-2024-21511 timezone code injection (3.9.7), CVE-2024-21508" },
];

/** Every installed copy (not dev-only) of the floor packages that is below its floor. */
export function belowFloors(lock: { packages: Record<string, { version?: string; dev?: boolean }> }) {
  const bad: string[] = [];
  let checked = 0;
  for (const [where, p] of Object.entries(lock.packages)) {
    const name = where.split("node_modules/").at(-1);
    const floor = FLOORS.find((f) => f.name === name);
    if (!floor || p.dev || !p.version) continue;
    checked++;
    if (!semver.gte(semver.coerce(p.version, { includePrerelease: true }) ?? "0.0.0", floor.min)) {
      bad.push(`${where} ${p.version} is below ${floor.min}: ${floor.why}`);
    }
  }
  return { bad, checked };
}

