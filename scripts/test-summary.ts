// Prints the failed tests from the JSON reports that scripts/test.sh asks of vitest and Playwright,
// one line each with the first line of the error. It runs last, so the tail of a long CI log
// (often all that is kept) still names what failed. Exit code 0 always: test.sh decides.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";

interface VitestReport {
  testResults: { name: string; status: string; message?: string; assertionResults: { fullName: string; status: string; failureMessages: string[] }[] }[];
}
interface PlaywrightSuite {
  title: string;
  file?: string;
  specs?: { title: string; tests: { results: { status: string; error?: { message?: string } }[] }[] }[];
  suites?: PlaywrightSuite[];
}

const plain = (s: string) => s.replace(/\u001b\[[0-9;]*m/g, "");
const firstLine = (s: string | undefined) => plain(s ?? "").split("\n").find((l) => l.trim() !== "")?.trim().slice(0, 300) ?? "(no message)";

export function vitestFailures(report: VitestReport, root: string): string[] {
  const out: string[] = [];
  for (const file of report.testResults) {
    const rel = path.relative(root, file.name);
    const failed = file.assertionResults.filter((t) => t.status === "failed");
    for (const t of failed) out.push(`${rel} > ${t.fullName}: ${firstLine(t.failureMessages[0])}`);
    // A file that failed before or outside its tests (import error, hook) has no failed test.
    if (file.status === "failed" && failed.length === 0) out.push(`${rel}: ${firstLine(file.message)}`);
  }
  return out;
}

export function playwrightFailures(suites: PlaywrightSuite[], trail: string[] = []): string[] {
  const out: string[] = [];
  for (const s of suites) {
    const here = s.title && !s.title.endsWith(".ts") ? [...trail, s.title] : trail;
    for (const spec of s.specs ?? []) {
      for (const t of spec.tests) {
        const last = t.results.at(-1);
        if (last && last.status !== "passed" && last.status !== "skipped") out.push(`${s.file ?? ""} > ${[...here, spec.title].join(" > ")}: ${firstLine(last.error?.message)}`);
      }
    }
    out.push(...playwrightFailures(s.suites ?? [], here));
  }
  return out;
}

function main(files: string[]) {
  const root = process.cwd();
  const lines: string[] = [];
  for (const f of files) {
    if (!existsSync(f)) continue;
    try {
      const report = JSON.parse(readFileSync(f, "utf8"));
      lines.push(...(Array.isArray(report.suites) ? playwrightFailures(report.suites).map((l) => `tests/e2e/${l}`) : vitestFailures(report, root)));
    } catch (e) {
      lines.push(`${f}: report unreadable (${e instanceof Error ? e.message : String(e)})`);
    }
  }
  if (lines.length === 0) return;
  console.error(`\n[spanproof] failed tests (${lines.length}):`);
  for (const l of lines) console.error(`  - ${l}`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main(process.argv.slice(2));
