// The review clock: pure business-day arithmetic, clock states, turnaround measures and
// reminder texts. No React, Next or database here; lib/review-clock/server.ts reads the settings.
export * from "./calendar";
export * from "./clock";
export * from "./format";
export * from "./targets";
export * from "./turnaround";
export * from "./zone";
export { US_FEDERAL_HOLIDAYS } from "./us-federal-holidays";
