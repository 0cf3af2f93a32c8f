import { analyse, type Analysis, type LoadSet } from "@/lib/solver/analysis";
import { DEFAULT_CLAIM_THRESHOLDS, DEFAULT_NEAR_LIMIT, type ClaimThresholds } from "@/lib/solver/claims";
import { combinationLoads, combosForCheck, CREEP_INTERPRETATIONS, factorKey, type ComboSpec, type CreepInterpretation } from "@/lib/solver/combinations";
import { Comparator, CROSS_CHECK_TOLERANCE, FLOOR_FRACTION, runStiffness } from "@/lib/solver/cross-check";
import { energyCheck } from "@/lib/solver/energy";
import { IssueList, SolverInputError } from "@/lib/solver/errors";
import { describeColumn } from "@/lib/solver/force-method";
import { IBC_2021_TABLE_1604_3, type LimitsTable } from "@/lib/solver/limits-ibc-2021";
import { parseModel, type ParsedInput } from "@/lib/solver/parse";
import type { ParsedCheck } from "@/lib/solver/parse-checks";
import type { SolveResult } from "@/lib/solver/result-types";
import { assembleChecks, assembleMembers, assembleReactions, type Scales } from "@/lib/solver/solve-results";
import type { StiffnessCaseResult } from "@/lib/solver/stiffness";
import { displacementUnitFor, metresPerUnit } from "@/lib/solver/units";
import { SOLVER_VERSION } from "@/lib/solver/version";

export interface SolveOptions {
  /** deflection limits; default IBC 2021 Table 1604.3 */
  limits?: LimitsTable;
  /** how creep enters D + L; default "ibc-footnote-d" */
  creep?: CreepInterpretation;
  claimThresholds?: ClaimThresholds;
  /** relative distance to a limit that is flagged (0.02) */
  nearLimit?: number;
  /** run the independent stiffness solution beside (default true) */
  crossCheck?: boolean;
  /** relative difference above which the two solutions disagree (1e-6) */
  crossCheckTolerance?: number;
  /** plot stations: equal intervals per member (default 10), or false for none */
  stations?: number | false;
}

export interface CheckPlan {
  check: ParsedCheck;
  rowLabel: string;
  combos: { spec: ComboSpec; set: number }[];
}

const CREEP_TEXT: Record<CreepInterpretation, string> = {
  "ibc-footnote-d": "IBC 2021 Table 1604.3 footnote d: creep part of D (0.5 D dry wood, 1.0 D other wood, 0 steel) plus L",
  "nds-3.5.2": "NDS 2018 §3.5.2: K_cr × Δ_D + Δ_L (K_cr 1.5 dry, 2.0 wet/panels/CLT)",
  immediate: "full immediate Δ_D + Δ_L",
};

function setName(factors: Record<string, number>): string {
  // dead load first, as combinations are written: "0.5D + L"
  return Object.keys(factors)
    .filter((k) => factors[k] !== 0)
    .sort((a, b) => (a === "D" ? -1 : b === "D" ? 1 : 0))
    .map((k) => `${factors[k] === 1 ? "" : factors[k]}${k}`)
    .join(" + ");
}

function planChecks(parsed: ParsedInput, table: LimitsTable, creep: CreepInterpretation, sets: LoadSet[]): CheckPlan[] {
  const issues = new IssueList();
  const cases = new Set(parsed.model.loads.map((l) => l.case));
  const keys = new Map<string, number>();
  const plans: CheckPlan[] = [];
  for (const check of parsed.checks) {
    const row = table.rows.find((r) => r.id === check.row);
    if (!row) {
      issues.add(`${check.path}.row`, `unknown row "${check.row}" of ${table.source}; use one of ${table.rows.map((r) => r.id).join(", ")}`);
      continue;
    }
    const combos = combosForCheck(check, row, table, cases, creep).map((spec) => {
      const key = factorKey(spec.factors);
      let set = keys.get(key);
      if (set === undefined) {
        set = sets.length;
        keys.set(key, set);
        sets.push({ name: setName(spec.factors), factors: spec.factors, loads: combinationLoads(parsed.model.loads, spec.factors) });
      }
      return { spec, set };
    });
    const names = combos.map((c) => c.spec.name);
    for (const claim of check.claimed) {
      const name = claim.combo === `${table.windFactor}W` ? "W" : claim.combo;
      if (!names.includes(name)) {
        const list = names.length > 0 ? names.join(", ") : "none: the model has no loads of the cases this row limits";
        issues.add(`${claim.path}.combo`, `"${claim.combo}" is not a combination of this check (${list})`);
      }
    }
    plans.push({ check, rowLabel: row.label, combos });
  }
  issues.throwIfAny();
  return plans;
}

function scalesOf(a: Analysis): Scales {
  const { st } = a.engine;
  let translation = 0;
  let rotation = 0;
  for (const sol of a.solutions) {
    a.parsed.model.nodes.forEach((_, i) => {
      translation = Math.max(translation, Math.abs(sol.d[st.row(i, "x")] ?? 0), Math.abs(sol.d[st.row(i, "y")] ?? 0));
      if (st.dofs.length === 3) rotation = Math.max(rotation, Math.abs(sol.d[st.row(i, "rz")] ?? 0));
    });
  }
  for (const set of a.terms) {
    set.forEach((t, i) => {
      if (a.parsed.model.find[i]?.dof !== "rz") translation = Math.max(translation, Math.abs(t.value));
    });
  }
  // beams on supports: the nodes stay put, the spans move
  a.parsed.model.members.forEach((_, j) => (translation = Math.max(translation, Math.abs(a.extreme(0, j).value))));
  let force = 0;
  let moment = 0;
  const all = a.solutions[0];
  st.columns.forEach((c, k) => {
    if (c.kind !== "R" || !all) return;
    const v = Math.abs(all.state.cols[k] ?? 0);
    if (c.dof === "rz") moment = Math.max(moment, v);
    else force = Math.max(force, v);
  });
  const Lc = a.parsed.model.members.reduce((s, m) => s + m.length, 0) / Math.max(1, a.parsed.model.members.length);
  // A stiffness solution leaves residual forces of order ε·k·u (k the stiffest member, u the
  // largest displacement); with only imposed deformations on a determinate structure they are
  // all it has, since every true reaction is zero. 1e-4·k·u keeps that roundoff from reading as
  // a disagreement while leaving real reactions far above it compared relatively.
  let stiffest = 0;
  for (const m of a.parsed.model.members) {
    if (m.A) stiffest = Math.max(stiffest, (m.E * m.A) / m.length);
    if (m.I) stiffest = Math.max(stiffest, (12 * m.E * m.I) / m.length ** 3);
  }
  force = Math.max(force, 1e-4 * stiffest * translation);
  return { translation, rotation, force, moment: Math.max(moment, force * Lc) };
}

/** Validates and solves a parsed model (see `solve`). */
export function solveParsed(parsed: ParsedInput, options: SolveOptions = {}): SolveResult {
  const creep = options.creep ?? "ibc-footnote-d";
  if (!CREEP_INTERPRETATIONS.includes(creep)) {
    throw new SolverInputError([{ path: "options.creep", message: `must be one of ${CREEP_INTERPRETATIONS.join(", ")}` }]);
  }
  const table = options.limits ?? IBC_2021_TABLE_1604_3;
  const { model } = parsed;
  const sets: LoadSet[] = [{ name: "all loads", factors: null, loads: model.loads }];
  const plans = planChecks(parsed, table, creep, sets);
  const a = analyse(parsed, sets);
  const tolerance = options.crossCheckTolerance ?? CROSS_CHECK_TOLERANCE;
  const cmp = new Comparator(tolerance);
  const stiff = options.crossCheck === false ? { error: "not requested" } : runStiffness(model, sets);
  const results: StiffnessCaseResult[] | null = "results" in stiff ? stiff.results : null;
  const displayUnit = displacementUnitFor(model.displayLengthUnit);
  const perDisplay = metresPerUnit(displayUnit) ?? 1;
  const scales = scalesOf(a);
  const members = assembleMembers(a, results?.[0] ?? null, cmp, scales, displayUnit, options.stations ?? 10);
  const floorFor = (dof: string): number => FLOOR_FRACTION * (dof === "rz" ? scales.rotation : scales.translation);

  const findFor = (s: number) =>
    model.find.map((f, i) => {
      const t = a.terms[s]?.[i] ?? { value: 0, members: [], supports: [] };
      const other = results?.[s]?.displacementAt(f.at, f.dof);
      const c =
        other === undefined
          ? { rel_diff: null, disagreement: false }
          : cmp.compare(`${sets[s]?.name}: find ${f.label} ${f.dof}`, t.value, other, floorFor(f.dof));
      return { label: f.label, dof: f.dof, value_si: t.value, stiffness_si: other ?? null, ...c, terms: t.members, support_terms: t.supports };
    });

  const find = findFor(0).map((f) => {
    const rotation = f.dof === "rz";
    return {
      ...f,
      unit_si: rotation ? ("rad" as const) : ("m" as const),
      value_display: rotation ? f.value_si : f.value_si / perDisplay,
      unit_display: rotation ? "rad" : displayUnit,
    };
  });
  const allSolution = a.solutions[0];
  if (!allSolution) throw new Error("internal: no load set");
  const energy = energyCheck(a.engine, allSolution, model.members.map((_, j) => a.field(0, j)));
  const reactions = assembleReactions(a, results?.[0] ?? null, cmp, scales);
  const checks = assembleChecks(a, plans, results, cmp, scales, {
    table,
    displayUnit,
    nearLimit: options.nearLimit ?? DEFAULT_NEAR_LIMIT,
    thresholds: options.claimThresholds ?? DEFAULT_CLAIM_THRESHOLDS,
  });
  const combinations = sets.slice(1).map((s, k) => ({ name: s.name, factors: s.factors ?? {}, find: findFor(k + 1) }));

  return {
    solver_version: SOLVER_VERSION,
    title: model.title,
    kind: model.kind,
    units: {
      si: { length: "m", displacement: "m", rotation: "rad", force: "N", moment: "N·m", energy: "J" },
      display: { length: model.displayLengthUnit, displacement: displayUnit, metres_per_displacement_unit: perDisplay },
    },
    method: {
      name: "unit-load method (virtual work); redundants by the force method with flexibility coefficients from virtual work",
      virtual_system: "unit force or couple applied to the primary (released) structure — the reduction theorem",
      integration:
        "Gauss–Legendre, 4 points per segment between breakpoints (exact to degree 7); members without member loads in closed form",
      degree_of_indeterminacy: a.engine.redundants.length,
      redundants: a.engine.redundants.map((c) => describeColumn(model, a.engine.st.columns[c] ?? { kind: "N", index: 0 })),
      reciprocity: {
        asymmetry: a.engine.reciprocity.asymmetry,
        path_difference: a.engine.reciprocity.pathDifference,
        tolerance: a.engine.reciprocity.tolerance,
      },
      stations_source:
        "virtual-work side: internal forces of the force method; displacements by integrating the strains between the node displacements of the unit-load method",
    },
    find,
    energy,
    reactions,
    members,
    combinations,
    checks,
    cross_check: {
      available: results !== null,
      method: "independent direct stiffness solution (lib/solver/stiffness)",
      tolerance,
      compared: cmp.compared,
      max_rel_diff: cmp.maxRel,
      disagreements: cmp.disagreements,
      ...("error" in stiff ? { error: stiff.error } : {}),
    },
    creep: { interpretation: creep, description: CREEP_TEXT[creep] },
    limits: { source: table.source, notes: table.notes },
    assumptions: [
      "linear elastic material, small displacements (first-order analysis)",
      "shear deformation included only for members given a shear entry (G, Av)",
      "beam and frame members given without A are axially rigid",
      "E as given: tabulated wood E is apparent E and already includes shear deformation",
      "span for a limit: as the check states, else the sum of the checked members' lengths",
      `creep: ${CREEP_TEXT[creep]}`,
    ],
    not_covered: ["ponding", "vibration", "second-order (P-delta) effects", "connection slip", "cracking unless an effective I is given"],
  };
}

/**
 * The checker's public entry: validates a `*.model.json` object (throws SolverInputError with
 * path-named messages), solves it by virtual work for every find item and combination, and
 * cross-checks it against the independent stiffness solution. Pure: no I/O, no clock.
 */
export function solve(model: unknown, options: SolveOptions = {}): SolveResult {
  return solveParsed(parseModel(model), options);
}
