/** Stored with every deflection check so a re-run can tell which engine produced it. */
export const SOLVER_VERSION = "spanproof-solver 1.0.0";
