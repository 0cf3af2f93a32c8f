import type { Analysis } from "@/lib/solver/analysis";
import { claimVerdict, limitVerdict, type ClaimThresholds } from "@/lib/solver/claims";
import { FLOOR_FRACTION, type Comparator } from "@/lib/solver/cross-check";
import type { LimitsTable } from "@/lib/solver/limits-ibc-2021";
import { fieldAt, type MemberField } from "@/lib/solver/member-field";
import type { CheckResult, MemberResult, ReactionResult, Station } from "@/lib/solver/result-types";
import type { CheckPlan } from "@/lib/solver/solve";
import type { StiffnessCaseResult } from "@/lib/solver/stiffness";
import type { Dof, ParsedLocation, ParsedMember } from "@/lib/solver/types";
import { metresPerUnit } from "@/lib/solver/units";

/** Largest magnitudes of each kind (m, rad, N, N·m), for the cross-check floors. */
export interface Scales {
  translation: number;
  rotation: number;
  force: number;
  moment: number;
}

/** Transverse (local y) displacement of a member point in the stiffness solution, m. */
function stiffnessTransverse(r: StiffnessCaseResult, m: ParsedMember, x: number): number {
  const at = { member: m.id, x };
  return -r.displacementAt(at, "x") * m.sin + r.displacementAt(at, "y") * m.cos;
}

function stationsOf(f: MemberField, intervals: number): Station[] {
  const L = f.g.member.length;
  const xs: { x: number; side: "left" | "right" }[] = [];
  for (let i = 0; i <= intervals; i++) xs.push({ x: (L * i) / intervals, side: i === intervals ? "left" : "right" });
  // Both limits at interior breakpoints, so that jumps in V and M plot as jumps.
  for (let k = 1; k + 1 < f.g.xs.length; k++) {
    const x = f.g.xs[k] ?? 0;
    xs.push({ x, side: "left" }, { x, side: "right" });
  }
  xs.sort((p, q) => p.x - q.x || (p.side === q.side ? 0 : p.side === "left" ? -1 : 1));
  return xs.map(({ x, side }) => {
    const v = fieldAt(f, x, side);
    return { x_m: x, ux_m: v.ux, uy_m: v.uy, rz_rad: v.theta, N_N: v.N, V_N: v.V, M_Nm: v.M };
  });
}

export function assembleMembers(
  a: Analysis,
  stiff: StiffnessCaseResult | null,
  cmp: Comparator,
  scales: Scales,
  displayUnit: string,
  stations: number | false,
): MemberResult[] {
  const per = metresPerUnit(displayUnit) ?? 1;
  return a.parsed.model.members.map((m, j) => {
    const f = a.field(0, j);
    const ext = a.extreme(0, j);
    const other = stiff ? stiffnessTransverse(stiff, m, ext.x) : null;
    const c =
      other === null
        ? { rel_diff: null, disagreement: false }
        : cmp.compare(`member ${m.id} largest deflection`, ext.value, other, FLOOR_FRACTION * scales.translation);
    const s = fieldAt(f, 0, "right");
    const e = fieldAt(f, m.length, "left");
    return {
      id: m.id,
      length_m: m.length,
      end_forces: { start: { N_N: s.N, V_N: s.V, M_Nm: s.M }, end: { N_N: e.N, V_N: e.V, M_Nm: e.M } },
      extreme: {
        deflection_m: ext.value,
        deflection_display: ext.value / per,
        unit_display: displayUnit,
        x_m: ext.x,
        x_over_length: ext.x / m.length,
        stiffness_si: other,
        ...c,
      },
      stations: stations === false ? [] : stationsOf(f, Math.max(1, Math.round(stations))),
    };
  });
}

export function assembleReactions(a: Analysis, stiff: StiffnessCaseResult | null, cmp: Comparator, scales: Scales): ReactionResult[] {
  const { st, model } = a.engine;
  const sol = a.solutions[0];
  return model.supports.map((s) => {
    const i = st.nodeIndex.get(s.node) ?? 0;
    const nd = st.dofs.length;
    const value = (k: number): number | null => {
      const c = st.reactionCol[i * nd + k] ?? -1;
      return c < 0 ? null : (sol?.state.cols[c] ?? 0);
    };
    const Fx = value(0);
    const Fy = value(1);
    const M = nd === 3 ? value(2) : null;
    const o = stiff?.reactions.get(s.node);
    let rel: number | null = null;
    let disagreement = false;
    if (o) {
      rel = 0;
      for (const [v, w, floor, dof] of [
        [Fx, o.Fx, scales.force, "Fx"],
        [Fy, o.Fy, scales.force, "Fy"],
        [M, o.M, scales.moment, "M"],
      ] as const) {
        if (v === null) continue;
        const c = cmp.compare(`reaction ${s.node} ${dof}`, v, w, FLOOR_FRACTION * floor);
        rel = Math.max(rel, c.rel_diff);
        disagreement ||= c.disagreement;
      }
    }
    return {
      node: s.node,
      Fx_N: Fx,
      Fy_N: Fy,
      M_Nm: M,
      stiffness: o ? { Fx_N: Fx === null ? null : o.Fx, Fy_N: Fy === null ? null : o.Fy, M_Nm: M === null ? null : o.M } : null,
      rel_diff: rel,
      disagreement,
    };
  });
}

/** Displacement of a location in one load set from the virtual-work side (m or rad). */
export function displacementOf(a: Analysis, s: number, at: ParsedLocation, dof: Dof): number {
  const { st } = a.engine;
  if ("node" in at) return a.solutions[s]?.d[st.row(st.nodeIndex.get(at.node) ?? 0, dof)] ?? 0;
  const v = fieldAt(a.field(s, st.memberIndex.get(at.member) ?? 0), at.x);
  return dof === "x" ? v.ux : dof === "y" ? v.uy : v.theta;
}

export function assembleChecks(
  a: Analysis,
  plans: CheckPlan[],
  stiff: StiffnessCaseResult[] | null,
  cmp: Comparator,
  scales: Scales,
  o: { table: LimitsTable; displayUnit: string; nearLimit: number; thresholds: ClaimThresholds },
): CheckResult[] {
  const per = metresPerUnit(o.displayUnit) ?? 1;
  const { st, model } = a.engine;
  return plans.map(({ check, rowLabel, combos }) => {
    const limitSpan = check.span * (check.cantilever ? o.table.cantileverFactor : 1);
    return {
      id: check.id,
      row: check.row,
      row_label: rowLabel,
      members: check.members,
      at: check.at ? { label: check.at.label, dof: check.at.dof } : null,
      span_m: check.span,
      cantilever: check.cantilever,
      material: check.material,
      combos: combos.map(({ spec, set }) => {
        let delta = 0;
        let where: { member: string; x_m: number } | null = null;
        let other: number | null = null;
        const r = stiff?.[set];
        if (check.at) {
          delta = displacementOf(a, set, check.at.location, check.at.dof);
          if (r) other = r.displacementAt(check.at.location, check.at.dof);
        } else {
          let best = -1;
          for (const id of check.members) {
            const j = st.memberIndex.get(id) ?? 0;
            const ext = a.extreme(set, j);
            if (Math.abs(ext.value) > best) {
              best = Math.abs(ext.value);
              delta = ext.value;
              where = { member: id, x_m: ext.x };
            }
          }
          const m = where ? model.members[st.memberIndex.get(where.member) ?? 0] : undefined;
          if (r && m && where) other = stiffnessTransverse(r, m, where.x_m);
        }
        const c =
          other === null
            ? { rel_diff: null, disagreement: false }
            : cmp.compare(`check ${check.id} ${spec.name}`, delta, other, FLOOR_FRACTION * scales.translation);
        const verdict = limitVerdict(delta, limitSpan, spec.denominator, o.nearLimit);
        const claimed = check.claimed.find((k) => (k.combo === `${o.table.windFactor}W` ? "W" : k.combo) === spec.name);
        return {
          name: spec.name,
          column: spec.column,
          basis: spec.basis,
          factors: spec.factors,
          verdict: {
            ...verdict,
            delta_display: verdict.delta_m / per,
            allowable_display: verdict.allowable_m / per,
            unit_display: o.displayUnit,
          },
          where,
          stiffness_si: other,
          ...c,
          claim: claimed ? claimVerdict(spec.name, claimed.delta, delta, verdict.allowable_m, o.thresholds) : null,
        };
      }),
    };
  });
}
