import { z } from "zod";

import type { SolverInputIssue } from "@/lib/solver/errors";

// The shape of a `*.model.json` file (see lib/solver/model-format.md). Only the shape is
// checked here; units, ids and physics are checked in parse.ts with path-named messages.

const quantity = z.string({
  error: (iss) => (iss.input === undefined ? "is required" : 'must be a string with a unit, e.g. "16 ft"'),
});
const id = z.string({ error: (iss) => (iss.input === undefined ? "is required" : "must be a string id") }).min(1, {
  error: "must not be empty",
});
const note = z.string().optional();
const loadCase = z.string().min(1, { error: "must not be empty" }).optional();
const dof = z.enum(["x", "y", "rz"], { error: 'must be "x", "y" or "rz"' });

export const nodeSchema = z.tuple([quantity, quantity], { error: 'must be two coordinates, e.g. ["0 ft", "0 ft"]' });

export const memberSchema = z.strictObject({
  ends: z.tuple([id, id], { error: 'must be two node ids, e.g. ["A", "B"]' }),
  E: quantity,
  I: quantity.optional(),
  A: quantity.optional(),
  shear: z.strictObject({ G: quantity, Av: quantity }).optional(),
  release: z.array(z.enum(["start", "end"], { error: 'must be "start" or "end"' })).optional(),
  note,
});

export const supportSchema = z.union(
  [z.enum(["pin", "roller", "roller-x", "fixed"]), z.array(dof).min(1, { error: "must hold at least one dof" })],
  { error: 'must be "pin", "roller", "roller-x", "fixed" or a list of dofs like ["x", "rz"]' },
);

const direction = z.enum(["global", "local"], { error: 'must be "global" or "local"' }).optional();

export const loadSchemas = {
  node: z.strictObject({
    node: id,
    Fx: quantity.optional(),
    Fy: quantity.optional(),
    M: quantity.optional(),
    case: loadCase,
    note,
  }),
  settlement: z.strictObject({
    node: id,
    settle: z.tuple([quantity, quantity], { error: 'must be two movements [x, y], e.g. ["0 in", "-0.25 in"]' }),
    case: loadCase,
    note,
  }),
  line: z.strictObject({
    member: id,
    w: z.union([quantity, z.tuple([quantity, quantity])], {
      error: 'must be a line load like "-150 lbf/ft" or a pair ["-100 lbf/ft", "-300 lbf/ft"]',
    }),
    from: quantity.optional(),
    to: quantity.optional(),
    dir: direction,
    per: z.enum(["member", "horizontal"], { error: 'must be "member" or "horizontal"' }).optional(),
    case: loadCase,
    note,
  }),
  point: z.strictObject({ member: id, P: quantity, at: quantity, dir: direction, case: loadCase, note }),
  moment: z.strictObject({ member: id, M: quantity, at: quantity, case: loadCase, note }),
  thermal: z.strictObject({ member: id, dT: quantity, alpha: quantity, case: loadCase, note }),
  misfit: z.strictObject({ member: id, misfit: quantity, case: loadCase, note }),
} as const;

export type LoadShape = keyof typeof loadSchemas;

export const findSchema = z.strictObject({ node: id, dof, note });

export const MATERIALS = [
  "sawn-dry",
  "sawn-wet",
  "glulam",
  "i-joist",
  "scl",
  "clt",
  "panel",
  "steel",
  "aluminum",
  "concrete",
  "other",
] as const;

export const checkSchema = z.strictObject({
  id: z.string().optional(),
  member: id.optional(),
  members: z.array(id).min(1, { error: "must name at least one member" }).optional(),
  at: findSchema.optional(),
  row: id,
  span: quantity.optional(),
  cantilever: z.boolean({ error: "must be true or false" }).optional(),
  material: z.enum(MATERIALS, { error: `must be one of ${MATERIALS.map((m) => `"${m}"`).join(", ")}` }).optional(),
  claimed: z.array(z.strictObject({ combo: id, delta: quantity, note })).optional(),
  note,
});

export const modelFileSchema = z.strictObject({
  $schema: z.string().optional(),
  title: z.string().optional(),
  description: z.string().optional(),
  kind: z.enum(["beam", "truss", "frame"], { error: 'must be "beam", "truss" or "frame"' }),
  nodes: z.record(z.string(), nodeSchema, { error: "must be an object of node id → [x, y]" }),
  members: z.record(z.string(), memberSchema, { error: "must be an object of member id → member" }),
  supports: z.record(z.string(), supportSchema, { error: "must be an object of node id → support" }),
  loads: z.array(z.unknown(), { error: "must be a list of loads" }).optional(),
  find: z.array(findSchema, { error: "must be a list of displacements to find" }).optional(),
  checks: z.array(checkSchema, { error: "must be a list of deflection checks" }).optional(),
});

export type ModelFile = z.infer<typeof modelFileSchema>;
export type CheckFile = z.infer<typeof checkSchema>;

/** "members.B2.I", "loads[2].at"; the root is called "model". */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out === "" ? String(part) : `.${String(part)}`;
  }
  return out === "" ? "model" : out;
}

function article(word: string): string {
  return /^[aeiou]/.test(word) ? `an ${word}` : `a ${word}`;
}

/** zod's issues as path-named messages; custom `error` texts above win over the generic ones. */
export function zodIssues(error: z.ZodError, prefix: readonly PropertyKey[] = []): SolverInputIssue[] {
  const out: SolverInputIssue[] = [];
  for (const issue of error.issues) {
    const path = formatPath([...prefix, ...issue.path]);
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys) out.push({ path, message: `unknown field "${key}"` });
      continue;
    }
    let message = issue.message;
    if (message.startsWith("Invalid input: expected ")) {
      const expected = issue.code === "invalid_type" ? String(issue.expected) : "value";
      message = message.includes("received undefined") ? "is required" : `must be ${article(expected)}`;
    } else if (message.startsWith("Invalid option")) {
      message = "is not one of the allowed values";
    }
    out.push({ path, message });
  }
  return out;
}
