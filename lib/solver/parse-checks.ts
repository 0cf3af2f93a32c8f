import type { CheckFile, MATERIALS } from "@/lib/solver/model-schema";
import { parseLocation, type ParseContext } from "@/lib/solver/parse-loads";
import type { Dof, ParsedLocation } from "@/lib/solver/types";
import { parseQuantity } from "@/lib/solver/units";

export type Material = (typeof MATERIALS)[number];

export interface ParsedClaim {
  /** combination name as written, e.g. "L", "D+L", "W" */
  combo: string;
  /** claimed deflection magnitude, m */
  delta: number;
  text: string;
  path: string;
}

/** A serviceability check the file asks for: which members (or point), which Table 1604.3 row. */
export interface ParsedCheck {
  id: string;
  path: string;
  /** deflection is the largest transverse displacement along these members … */
  members: string[];
  /** … or the displacement at this point in this dof */
  at?: { location: ParsedLocation; dof: Dof; label: string };
  /** row id of the limits table, e.g. "floor" */
  row: string;
  /** m; the span as the calc states it (for a cantilever, its length) */
  span: number;
  cantilever: boolean;
  material: Material;
  claimed: ParsedClaim[];
}

export function parseChecks(raw: CheckFile[], ctx: ParseContext): ParsedCheck[] {
  const out: ParsedCheck[] = [];
  raw.forEach((c, i) => {
    const path = `checks[${i}]`;
    const given = [c.member, c.members, c.at].filter((v) => v !== undefined).length;
    if (given !== 1) {
      ctx.issues.add(path, 'give exactly one of "member", "members" or "at"');
      return;
    }
    const members: string[] = [];
    let at: ParsedCheck["at"];
    let length = 0;
    let ok = true;
    if (c.at) {
      const location = parseLocation(ctx, `${path}.at.node`, c.at.node);
      if (!location) return;
      if (ctx.kind === "truss" && c.at.dof === "rz") {
        ctx.issues.add(`${path}.at.dof`, 'a truss has no rotations; use "x" or "y"');
        return;
      }
      at = { location, dof: c.at.dof, label: c.at.node };
    } else {
      const ids = c.member !== undefined ? [c.member] : (c.members ?? []);
      ids.forEach((id, k) => {
        const p = c.member !== undefined ? `${path}.member` : `${path}.members[${k}]`;
        if (!(id in ctx.fileMembers)) {
          ctx.issues.add(p, `unknown member "${id}"`);
          ok = false;
          return;
        }
        const m = ctx.members.get(id);
        if (!m) ok = false;
        else {
          members.push(id);
          length += m.length;
        }
      });
    }
    let span = length;
    if (c.span !== undefined) {
      const r = parseQuantity(c.span, "length");
      if (!r.ok) {
        ctx.issues.add(`${path}.span`, r.message);
        ok = false;
      } else if (!(r.si > 0)) {
        ctx.issues.add(`${path}.span`, "must be greater than zero");
        ok = false;
      } else span = r.si;
    } else if (at) {
      ctx.issues.add(`${path}.span`, "is required when the check is at a point");
      ok = false;
    }
    const claimed: ParsedClaim[] = [];
    (c.claimed ?? []).forEach((cl, k) => {
      const p = `${path}.claimed[${k}].delta`;
      const r = parseQuantity(cl.delta, "length");
      if (!r.ok) {
        ctx.issues.add(p, r.message);
        ok = false;
        return;
      }
      claimed.push({ combo: cl.combo, delta: Math.abs(r.si), text: cl.delta, path: `${path}.claimed[${k}]` });
    });
    if (!ok) return;
    out.push({
      id: c.id ?? (at ? at.label : members.join("+")),
      path,
      members,
      ...(at ? { at } : {}),
      row: c.row,
      span,
      cantilever: c.cantilever ?? false,
      material: c.material ?? "other",
      claimed,
    });
  });
  return out;
}
