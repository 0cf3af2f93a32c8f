import { describe, expect, it } from "vitest";
import { belowFloors } from "@/scripts/audit-floors";

describe("dependency version floors", () => {
  it("finds a nested copy below its floor and ignores dev-only copies", () => {
    const r = belowFloors({
      packages: {
        "": { version: "0.1.0" },
        "node_modules/nodemailer": { version: "10.6.1" },
        // A transitive copy, as next-auth once pulled in: GHSA-2x7j-588g-ccc2 was fixed in 9.1.0.
        "node_modules/next-auth/node_modules/nodemailer": { version: "7.0.5" },
        "node_modules/mysql2": { version: "3.9.7", dev: true },
        "node_modules/pdfjs-dist": { version: "6.2.107" },
        "node_modules/next": { version: "16.4.6" },
      },
    });
    expect(r.checked).toBe(4);
    expect(r.bad).toHaveLength(2);
    expect(r.bad[0]).toMatch(/^node_modules\/next-auth\/node_modules\/nodemailer 7\.0\.5 is below 9\.1\.1/);
    expect(r.bad[1]).toMatch(/^node_modules\/pdfjs-dist 6\.2\.107 is below 6\.2\.108/);
  });

  // Semantic Versioning 2.0.0, item 11: a pre-release ranks below its release, so 16.3.3-canary.2
  // predates the 16.3.3 fix.
  it("ranks a prerelease below its release", () => {
    expect(belowFloors({ packages: { "node_modules/next": { version: "16.3.3-canary.2" } } }).bad).toHaveLength(1);
    expect(belowFloors({ packages: { "node_modules/next": { version: "16.3.4-canary.1" } } }).bad).toHaveLength(0);
  });
});
