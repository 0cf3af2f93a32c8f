import type { Dof } from "@/lib/solver/types";

/** The assembled stiffness has a zero (or numerically zero) pivot: the named dof is unrestrained. */
export class StiffnessSingularError extends Error {
  readonly node: string;
  readonly dof: Dof;

  constructor(node: string, dof: Dof, why?: string) {
    super(
      `structure is unstable: node ${node} is free to move in ${dof === "rz" ? "rotation (rz)" : dof}` +
        (why ? ` (${why})` : ""),
    );
    this.name = "StiffnessSingularError";
    this.node = node;
    this.dof = dof;
  }
}

/** A model or load the stiffness cross-check cannot take, with the member/node/load named. */
export class StiffnessInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "StiffnessInputError";
  }
}
