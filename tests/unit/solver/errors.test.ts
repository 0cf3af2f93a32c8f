import { describe, expect, it } from "vitest";

import { solve, SolverInputError, type LimitsTable } from "@/lib/solver";

// Every refusal names the field and the reason; the messages are part of the product (the
// examiner reads them), so they are checked verbatim.

type Model = Record<string, unknown>;

function base(): Model {
  return {
    title: "FB-3",
    kind: "beam",
    nodes: { A: ["0 ft", "0 ft"], B: ["16 ft", "0 ft"] },
    members: { AB: { ends: ["A", "B"], E: "1600 ksi", I: "178 in^4", A: "16.9 in^2" } },
    supports: { A: "pin", B: "roller" },
    loads: [{ member: "AB", w: "-40 lbf/ft", case: "D" }],
    find: [{ node: "mid:AB", dof: "y" }],
  };
}

function truss(): Model {
  const bar = { E: "29000 ksi", A: "2 in^2" };
  return {
    kind: "truss",
    nodes: { A: ["0 m", "0 m"], B: ["4 m", "0 m"], C: ["0 m", "3 m"] },
    members: { AB: { ends: ["A", "B"], ...bar }, BC: { ends: ["B", "C"], ...bar }, AC: { ends: ["A", "C"], ...bar } },
    supports: { A: "pin", B: "roller" },
    loads: [{ node: "C", Fx: "1 kip" }],
    find: [{ node: "C", dof: "x" }],
  };
}

// Fixtures are edited freely, field by field; a loose type keeps each edit one readable line.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Loose = any;

function edit(model: Model, change: (m: Loose) => void): Model {
  const copy = structuredClone(model) as Loose;
  change(copy);
  return copy;
}

function messageOf(model: unknown, options?: Parameters<typeof solve>[1]): string {
  try {
    solve(model, options);
  } catch (e) {
    if (e instanceof SolverInputError) return e.message;
    throw e;
  }
  throw new Error("the model was accepted");
}

const cases: [string, Model, string][] = [
  ["a third moment given for I", edit(base(), (m) => (m.members.AB.I = "178 in^3")), 'members.AB.I: unit "in^3" is not a second moment of area'],
  ["zero E", edit(base(), (m) => (m.members.AB.E = "0 ksi")), "members.AB.E: must be greater than zero"],
  ["negative I", edit(base(), (m) => (m.members.AB.I = "-178 in^4")), "members.AB.I: must be greater than zero"],
  ["zero A", edit(base(), (m) => (m.members.AB.A = "0 in^2")), "members.AB.A: must be greater than zero"],
  ["zero length: coincident nodes", edit(base(), (m) => (m.nodes.B = ["0 in", "0 in"])), "nodes.B: coincides with node A"],
  ["a quantity without a unit", edit(base(), (m) => (m.members.AB.E = "1600")), 'members.AB.E: "1600" has no unit'],
  ["an unknown unit", edit(base(), (m) => (m.members.AB.E = "1600 kipsi")), 'members.AB.E: unit "kipsi" is not known'],
  ["not a number", edit(base(), (m) => (m.nodes.B = ["sixteen ft", "0 ft"])), 'nodes.B[0]: "sixteen ft" is not a number with a unit'],
  ["a force where a line load belongs", edit(base(), (m) => (m.loads[0].w = "-40 lbf")), 'loads[0].w: unit "lbf" is not a force per length'],
  ["a length where a modulus belongs", edit(base(), (m) => (m.members.AB.E = "1600 ft")), 'members.AB.E: unit "ft" is not a modulus (force per area)'],
  ["a length where a moment belongs", edit(base(), (m) => m.loads.push({ member: "AB", M: "5 kip", at: "3 ft" })), 'loads[1].M: unit "kip" is not a moment'],
  ["a load beyond the member", edit(base(), (m) => m.loads.push({ member: "AB", P: "-1.5 kip", at: "18 ft" })), 'loads[1].at: "18 ft" is outside member AB (length 16 ft)'],
  ["a find point beyond the member", edit(base(), (m) => (m.find = [{ node: "at:AB:20 ft", dof: "y" }])), 'find[0].node: "20 ft" is outside member AB (length 16 ft)'],
  ["a find point on no member", edit(base(), (m) => (m.nodes.Q = ["30 ft", "0 ft"])), "nodes.Q: is not connected to any member"],
  ["a find at an unknown node", edit(base(), (m) => (m.find = [{ node: "Q", dof: "y" }])), 'find[0].node: unknown node "Q"'],
  ["mid of an unknown member", edit(base(), (m) => (m.find = [{ node: "mid:XY", dof: "y" }])), 'find[0].node: unknown member "XY"'],
  ["a malformed at:", edit(base(), (m) => (m.find = [{ node: "at:AB", dof: "y" }])), 'find[0].node: "at:AB" must be "at:MEMBER:DISTANCE", e.g. "at:AB:6 ft"'],
  ["an unknown end node", edit(base(), (m) => (m.members.AB.ends = ["A", "Q"])), 'members.AB.ends[1]: unknown node "Q"\nnodes.B: is not connected to any member'],
  ["a member from a node to itself", edit(base(), (m) => (m.members.AB.ends = ["A", "A"])), "members.AB.ends: both ends are node A\nnodes.B: is not connected to any member"],
  ["a beam member without I", edit(base(), (m) => delete m.members.AB.I), "members.AB.I: is required for a beam or frame member"],
  ["a truss member without A", edit(truss(), (m) => delete m.members.BC.A), "members.BC.A: is required for a truss member"],
  ["a rotation asked of a truss", edit(truss(), (m) => (m.find = [{ node: "C", dof: "rz" }])), 'find[0].dof: a truss has no rotations; use "x" or "y"'],
  ["a line load on a truss member", edit(truss(), (m) => m.loads.push({ member: "AB", w: "-1 kip/ft" })), "loads[1].member: AB is a truss member (axial force only); apply the load at its nodes"],
  ["a fixed support on a truss", edit(truss(), (m) => (m.supports.A = "fixed")), 'supports.A: a truss node has no rotation to hold; use "pin", "roller" or ["x", "y"]'],
  ["a support at an unknown node", edit(base(), (m) => (m.supports.Q = "pin")), 'supports.Q: unknown node "Q"'],
  ["a mechanism: C swings about A", edit(truss(), (m) => delete m.members.BC), "supports: the structure is a mechanism — node C can move in x"],
  ["a mechanism: two rollers", edit(base(), (m) => (m.supports.A = "roller")), "supports: the structure is a mechanism — node A can move in x"],
  [
    "a mechanism: every member end at a node is hinged",
    {
      kind: "frame",
      nodes: { A: ["0 m", "0 m"], B: ["3 m", "0 m"], C: ["6 m", "0 m"] },
      members: {
        AB: { ends: ["A", "B"], E: "200 GPa", I: "1e-4 m^4", release: ["end"] },
        BC: { ends: ["B", "C"], E: "200 GPa", I: "1e-4 m^4", release: ["start"] },
      },
      supports: { A: "fixed", C: "fixed" },
      loads: [{ node: "B", Fy: "-10 kN" }],
    },
    "supports: the structure is a mechanism — node B can move in rz",
  ],
  ["settlement of a free dof", edit(base(), (m) => m.loads.push({ node: "B", settle: ["0.1 in", "0 in"] })), "loads[1].settle: node B is not held in x, so it cannot settle in x"],
  ["settlement of a node without support", edit(base(), (m) => { m.nodes.C = ["20 ft", "0 ft"]; m.members.BC = { ends: ["B", "C"], E: "1600 ksi", I: "178 in^4" }; m.loads.push({ node: "C", settle: ["0 in", "-0.1 in"] }); }), "loads[1].node: node C has no support, so it cannot settle"],
  ["a temperature change in feet", edit(base(), (m) => m.loads.push({ member: "AB", dT: "40 ft", alpha: "6.5e-6 1/degF" })), 'loads[1].dT: unit "ft" is not a temperature change'],
  ["a coefficient of expansion in kelvin", edit(base(), (m) => m.loads.push({ member: "AB", dT: "40 degF", alpha: "6.5e-6 degF" })), 'loads[1].alpha: unit "degF" is not a coefficient of thermal expansion (1/temperature)'],
  ["a load of no known shape", edit(base(), (m) => m.loads.push({ member: "AB", q: "1 kip" })), 'loads[1]: must name a "node" (with Fx, Fy, M or settle) or a "member" (with w, P, M, dT or misfit)'],
  ["a misspelt field", edit(base(), (m) => m.loads.push({ member: "AB", P: "-1 kip", At: "3 ft" })), 'loads[1].at: is required\nloads[1]: unknown field "At"'],
  ["from after to", edit(base(), (m) => m.loads.push({ member: "AB", w: "-1 kip/ft", from: "8 ft", to: "4 ft" })), 'loads[1]: "from" must be less than "to"'],
  ["an unknown kind", edit(base(), (m) => (m.kind = "arch")), 'kind: must be "beam", "truss" or "frame"'],
  ["a missing E", edit(base(), (m) => delete m.members.AB.E), "members.AB.E: is required"],
  ["a number where a quantity string belongs", edit(base(), (m) => (m.members.AB.E = 1600)), 'members.AB.E: must be a string with a unit, e.g. "16 ft"'],
  ["a node with one coordinate", edit(base(), (m) => (m.nodes.B = ["16 ft"])), 'nodes.B: must be two coordinates, e.g. ["0 ft", "0 ft"]'],
  ["not an object at all", [] as unknown as Model, "model: must be an object"],
  ["a check naming no member", edit(base(), (m) => (m.checks = [{ row: "floor" }])), 'checks[0]: give exactly one of "member", "members" or "at"'],
  ["a check at a point without a span", edit(base(), (m) => (m.checks = [{ at: { node: "mid:AB", dof: "y" }, row: "floor" }])), "checks[0].span: is required when the check is at a point"],
  [
    "a claim for a combination the check does not have",
    edit(base(), (m) => {
      m.loads.push({ member: "AB", w: "-120 lbf/ft", case: "L" });
      m.checks = [{ member: "AB", row: "floor", claimed: [{ combo: "S", delta: "0.2 in" }] }];
    }),
    'checks[0].claimed[0].combo: "S" is not a combination of this check (L, D+L)',
  ],
  [
    "an axially restrained member without A under a temperature change",
    {
      kind: "beam",
      nodes: { A: ["0 m", "0 m"], B: ["5 m", "0 m"] },
      members: { AB: { ends: ["A", "B"], E: "200 GPa", I: "1e-4 m^4" } },
      supports: { A: "pin", B: "pin" },
      loads: [{ member: "AB", dT: "30 K", alpha: "1.2e-5 1/K" }],
    },
    "members.AB.A: is required: the member is restrained along its axis and a temperature change, misfit or settlement acts, so its axial stiffness decides the forces",
  ],
];

describe("input errors: exact messages", () => {
  for (const [name, model, message] of cases) {
    it(name, () => expect(messageOf(model)).toBe(message));
  }

  it("a row the limits table lacks, with a custom table", () => {
    const table: LimitsTable = { source: "Larkspur Falls amendment 2024-3", rows: [{ id: "floor", label: "Floors", live: 480 }], windFactor: 0.42, cantileverFactor: 2, notes: [] };
    const model = edit(base(), (m) => (m.checks = [{ member: "AB", row: "attic" }]));
    expect(messageOf(model, { limits: table })).toBe('checks[0].row: unknown row "attic" of Larkspur Falls amendment 2024-3; use one of floor');
  });

  it("an unknown creep interpretation", () => {
    expect(messageOf(base(), { creep: "half" as never })).toBe("options.creep: must be one of ibc-footnote-d, nds-3.5.2, immediate");
  });

  it("the error carries every issue with its path", () => {
    const model = edit(base(), (m) => {
      m.members.AB.E = "0 ksi";
      m.members.AB.I = "178 in^3";
    });
    try {
      solve(model);
      expect.fail("accepted");
    } catch (e) {
      expect(e).toBeInstanceOf(SolverInputError);
      const err = e as SolverInputError;
      expect(err.issues).toEqual([
        { path: "members.AB.E", message: "must be greater than zero" },
        { path: "members.AB.I", message: 'unit "in^3" is not a second moment of area' },
      ]);
      expect(err.path).toBe("members.AB.E");
    }
  });
});
