// The parsed structural model: the one thing the virtual-work checker and the
// independent stiffness cross-check share. Everything is SI (m, N, Pa, rad, K)
// and already validated; no strings with units survive past the parser.

export type StructureKind = "beam" | "truss" | "frame";

/** Degree of freedom at a node, global axes: x right, y up, rz counter-clockwise. */
export type Dof = "x" | "y" | "rz";

export interface ParsedNode {
  id: string;
  /** m */
  x: number;
  /** m */
  y: number;
}

export interface ParsedMember {
  id: string;
  /** node ids, first end → second end defines the local x axis */
  start: string;
  end: string;
  /** Pa */
  E: number;
  /** m^4; undefined for truss members */
  I?: number;
  /** m^2; required for truss members, optional on beams (then axially rigid) */
  A?: number;
  /** Shear term, when given: G in Pa, Av (effective shear area, A / form factor) in m^2 */
  shear?: { G: number; Av: number };
  /** Hinge (moment release) at the start and/or end of the member */
  releaseStart: boolean;
  releaseEnd: boolean;
  /** m, derived from the nodes */
  length: number;
  /** direction cosines of the local x axis */
  cos: number;
  sin: number;
}

export interface ParsedSupport {
  node: string;
  /** which global dofs are held */
  x: boolean;
  y: boolean;
  rz: boolean;
}

/** Every load carries a case; "D" when the file gives none. */
export type LoadCase = string;

export type ParsedLoad =
  /** N, N, N·m (M counter-clockwise positive) */
  | { type: "node"; case: LoadCase; node: string; Fx: number; Fy: number; M: number }
  /**
   * Linearly varying line load on [a, b] (m, measured along the member from its first end),
   * intensity wa → wb in N per metre of member length (a load given per horizontal projection
   * has already been converted by the parser). Direction: "global" means global y
   * (negative = down); "local" means local y.
   */
  | { type: "line"; case: LoadCase; member: string; a: number; b: number; wa: number; wb: number; dir: "global" | "local" }
  /** N at distance a (m) from the first end; direction as for line loads */
  | { type: "point"; case: LoadCase; member: string; a: number; P: number; dir: "global" | "local" }
  /** concentrated couple on a member, N·m counter-clockwise positive, at a (m) */
  | { type: "moment"; case: LoadCase; member: string; a: number; M: number }
  /** uniform temperature change (K) with coefficient alpha (1/K) */
  | { type: "thermal"; case: LoadCase; member: string; dT: number; alpha: number }
  /** member fabricated too long by delta (m); negative = too short */
  | { type: "misfit"; case: LoadCase; member: string; delta: number }
  /** prescribed support movement (m); only on held dofs */
  | { type: "settlement"; case: LoadCase; node: string; dx: number; dy: number };

/** Where a displacement is asked for: at a node, or at distance x (m) along a member. */
export type ParsedLocation = { node: string } | { member: string; x: number };

export interface ParsedFind {
  /** the text the user wrote, e.g. "mid:AB", kept for reports */
  label: string;
  at: ParsedLocation;
  dof: Dof;
}

export interface ParsedModel {
  title: string;
  kind: StructureKind;
  nodes: ParsedNode[];
  members: ParsedMember[];
  supports: ParsedSupport[];
  loads: ParsedLoad[];
  find: ParsedFind[];
  /** The length unit the file used, so results can be echoed in it ("ft" → displacements in "in"). */
  displayLengthUnit: string;
}
