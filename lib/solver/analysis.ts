import { buildEngine, compileLoads, solveReal, type Engine, type RealSolution } from "@/lib/solver/force-method";
import { maxTransverse, type TransverseExtreme } from "@/lib/solver/extremes";
import { buildMemberField, FIELD_SIZE_PER_SEGMENT, type MemberField } from "@/lib/solver/member-field";
import type { ForceState } from "@/lib/solver/member-work";
import type { ParsedInput } from "@/lib/solver/parse";
import type { ParsedLoad } from "@/lib/solver/types";
import { unitLoadTerms, virtualState, type UnitLoadResult } from "@/lib/solver/unit-load";

/** One set of loads solved together: all loads unfactored, or one serviceability combination. */
export interface LoadSet {
  name: string;
  /** case → factor; null for "all loads, unfactored" */
  factors: Record<string, number> | null;
  loads: ParsedLoad[];
}

/** The virtual-work side, factored once and solved for every load set and every unit load. */
export interface Analysis {
  parsed: ParsedInput;
  engine: Engine;
  sets: LoadSet[];
  solutions: RealSolution[];
  /** per find item: the virtual unit state on the primary structure */
  virtual: ForceState[];
  /** [load set][find item] */
  terms: UnitLoadResult[][];
  /** the member field of load set s, member j (built on first use) */
  field: (s: number, j: number) => MemberField;
  /** its largest transverse displacement (found on first use) */
  extreme: (s: number, j: number) => TransverseExtreme;
}

/** Every position (m) on each member that must be a breakpoint of the integration. */
export function memberPositions(parsed: ParsedInput): Map<string, number[]> {
  const out = new Map<string, number[]>();
  const add = (member: string, x: number): void => {
    const list = out.get(member);
    if (list) list.push(x);
    else out.set(member, [x]);
  };
  for (const l of parsed.model.loads) {
    if (l.type === "point" || l.type === "moment") add(l.member, l.a);
    if (l.type === "line") {
      add(l.member, l.a);
      add(l.member, l.b);
    }
  }
  for (const f of parsed.model.find) if ("member" in f.at) add(f.at.member, f.at.x);
  for (const c of parsed.checks) if (c.at && "member" in c.at.location) add(c.at.location.member, c.at.location.x);
  return out;
}

export function analyse(parsed: ParsedInput, sets: LoadSet[]): Analysis {
  const engine = buildEngine(parsed.model, memberPositions(parsed));
  const solutions = sets.map((s) => solveReal(engine, compileLoads(engine, s.loads)));
  const virtual = parsed.model.find.map((f) => virtualState(engine, f.at, f.dof));
  const terms = solutions.map((sol) => virtual.map((v) => unitLoadTerms(engine, v, sol)));
  const cache = new Map<number, MemberField>();
  const nMembers = parsed.model.members.length;
  // One coefficient pool per load set, each member at a fixed place in it.
  const base = new Int32Array(nMembers + 1);
  engine.geo.forEach((g, j) => (base[j + 1] = (base[j] ?? 0) + (g.xs.length - 1) * FIELD_SIZE_PER_SEGMENT));
  const pools = new Map<number, Float64Array>();
  const field = (s: number, j: number): MemberField => {
    const key = s * nMembers + j;
    let f = cache.get(key);
    if (!f) {
      const sol = solutions[s];
      if (!sol) throw new Error(`internal: no load set ${s}`);
      let c = pools.get(s);
      if (!c) {
        c = new Float64Array(base[nMembers] ?? 0);
        pools.set(s, c);
      }
      f = buildMemberField(engine, j, sol.state, sol.d, { c, at: base[j] ?? 0 });
      cache.set(key, f);
    }
    return f;
  };
  const extremes = new Map<number, TransverseExtreme>();
  const extreme = (s: number, j: number): TransverseExtreme => {
    const key = s * nMembers + j;
    let e = extremes.get(key);
    if (!e) {
      e = maxTransverse(field(s, j));
      extremes.set(key, e);
    }
    return e;
  };
  return { parsed, engine, sets, solutions, virtual, terms, field, extreme };
}
