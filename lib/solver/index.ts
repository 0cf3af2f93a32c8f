// Public surface of the energy-method checker. Pure TypeScript: no React, Next, database,
// file-system or clock imports anywhere under lib/solver.
export { solve, solveParsed, type SolveOptions } from "@/lib/solver/solve";
export { parseModel, type ParsedInput } from "@/lib/solver/parse";
export { SolverInputError, type SolverInputIssue } from "@/lib/solver/errors";
export { SOLVER_VERSION } from "@/lib/solver/version";
export { IBC_2021_TABLE_1604_3, type LimitRow, type LimitsTable } from "@/lib/solver/limits-ibc-2021";
export { CREEP_INTERPRETATIONS, creepFactor, type CreepInterpretation } from "@/lib/solver/combinations";
export { DEFAULT_CLAIM_THRESHOLDS, DEFAULT_NEAR_LIMIT, type ClaimThresholds } from "@/lib/solver/claims";
export type { ParsedCheck, Material } from "@/lib/solver/parse-checks";
export type * from "@/lib/solver/result-types";
export type * from "@/lib/solver/types";
