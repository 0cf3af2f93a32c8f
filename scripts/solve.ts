// Command-line checker: npm run --silent solve -- FILE.model.json [MORE.model.json …] [--summary]
// Prints JSON (one object for one file, an array in order for several), or with --summary a
// short table. A bad model exits 1 with the reason on stderr, each line prefixed by the file.
import { readFileSync } from "node:fs";
import { pathToFileURL } from "node:url";

import { CREEP_INTERPRETATIONS, solve, SolverInputError, type CreepInterpretation, type SolveResult } from "@/lib/solver";

interface Cli {
  files: string[];
  summary: boolean;
  creep?: CreepInterpretation;
  stations?: number;
  crossCheck: boolean;
}

const USAGE =
  "usage: npm run --silent solve -- FILE.model.json [MORE …] [--summary] [--creep=ibc-footnote-d|nds-3.5.2|immediate] [--stations=N] [--no-cross-check]\n";

class UsageError extends Error {}

function usage(): never {
  throw new UsageError(USAGE);
}

function parseArgs(argv: string[]): Cli {
  const cli: Cli = { files: [], summary: false, crossCheck: true };
  for (const arg of argv) {
    if (arg === "--summary") cli.summary = true;
    else if (arg === "--no-cross-check") cli.crossCheck = false;
    else if (arg.startsWith("--creep=")) {
      const v = arg.slice(8) as CreepInterpretation;
      if (!CREEP_INTERPRETATIONS.includes(v)) usage();
      cli.creep = v;
    } else if (arg.startsWith("--stations=")) {
      const n = Number(arg.slice(11));
      if (!Number.isInteger(n) || n < 1) usage();
      cli.stations = n;
    } else if (arg.startsWith("--")) usage();
    else cli.files.push(arg);
  }
  if (cli.files.length === 0) usage();
  return cli;
}

const fmt = (v: number | null | undefined, digits = 4): string =>
  v === null || v === undefined || !Number.isFinite(v) ? "—" : Number(v.toPrecision(digits)).toString();

function summary(file: string, r: SolveResult): string {
  const lines: string[] = [];
  const per = r.units.display.metres_per_displacement_unit;
  lines.push(`${file}: ${r.title || "(untitled)"} — ${r.kind}, indeterminate to degree ${r.method.degree_of_indeterminacy}`);
  lines.push("  find                 dof  virtual work        stiffness           rel. diff");
  for (const f of r.find) {
    const stiff = f.stiffness_si === null ? null : f.unit_si === "m" ? f.stiffness_si / per : f.stiffness_si;
    lines.push(
      `  ${f.label.padEnd(20)} ${f.dof.padEnd(4)} ${`${fmt(f.value_display, 6)} ${f.unit_display}`.padEnd(19)} ${`${fmt(stiff, 6)} ${f.unit_display}`.padEnd(19)} ${fmt(f.rel_diff, 2)}${f.disagreement ? "  DISAGREES" : ""}`,
    );
  }
  lines.push(
    `  energy: external work ${fmt(r.energy.external_work_J, 8)} J, strain energy ${fmt(r.energy.strain_energy_J, 8)} J${r.energy.applies ? "" : " (need not balance: initial strains or settlement)"}`,
  );
  for (const x of r.reactions) lines.push(`  reaction ${x.node}: Fx ${fmt(x.Fx_N, 6)} N, Fy ${fmt(x.Fy_N, 6)} N, M ${fmt(x.M_Nm, 6)} N·m`);
  for (const c of r.checks) {
    for (const k of c.combos) {
      const v = k.verdict;
      const claim = k.claim ? `, claimed ${fmt(k.claim.claimed_m / per, 3)} ${v.unit_display}: ${k.claim.verdict}` : "";
      lines.push(
        `  check ${c.id} ${k.name}: Δ ${fmt(v.delta_display, 3)} ${v.unit_display} = l/${fmt(v.span_over_delta, 4)}, limit ${v.limit} (${fmt(v.allowable_display, 3)} ${v.unit_display}) ${v.pass ? "PASS" : "FAIL"}${v.near_limit ? " near limit" : ""}${claim}`,
      );
    }
  }
  const xc = r.cross_check;
  lines.push(
    xc.available
      ? `  cross-check: ${xc.compared} values, largest relative difference ${fmt(xc.max_rel_diff, 2)}, ${xc.disagreements.length} disagreements`
      : `  cross-check: not available (${xc.error ?? "?"})`,
  );
  return lines.join("\n");
}

export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  readFile: (path: string) => string;
}

/** Runs the checker on the arguments; returns the exit code (0 ok, 1 bad model, 2 usage). */
export function runCli(argv: string[], io: CliIo): number {
  let cli: Cli;
  try {
    cli = parseArgs(argv);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    io.stderr(e.message);
    return 2;
  }
  const results: SolveResult[] = [];
  let failed = false;
  for (const file of cli.files) {
    let raw: unknown;
    try {
      raw = JSON.parse(io.readFile(file));
    } catch (e) {
      io.stderr(`${file}: ${e instanceof Error ? e.message : String(e)}\n`);
      failed = true;
      continue;
    }
    try {
      results.push(
        solve(raw, {
          ...(cli.creep ? { creep: cli.creep } : {}),
          ...(cli.stations ? { stations: cli.stations } : {}),
          crossCheck: cli.crossCheck,
        }),
      );
    } catch (e) {
      if (!(e instanceof SolverInputError)) throw e;
      for (const line of e.message.split("\n")) io.stderr(`${file}: ${line}\n`);
      failed = true;
    }
  }
  if (failed) return 1;
  if (cli.summary) io.stdout(`${results.map((r, i) => summary(cli.files[i] ?? "", r)).join("\n\n")}\n`);
  else io.stdout(`${JSON.stringify(results.length === 1 ? results[0] : results, null, 2)}\n`);
  return 0;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  // Piping into `head` closes stdout early; that is not an error of the checker.
  process.stdout.on("error", (e: NodeJS.ErrnoException) => {
    if (e.code === "EPIPE") process.exit(0);
    throw e;
  });
  const code = runCli(process.argv.slice(2), {
    stdout: (t) => process.stdout.write(t),
    stderr: (t) => process.stderr.write(t),
    readFile: (p) => readFileSync(p, "utf8"),
  });
  process.exitCode = code;
}
