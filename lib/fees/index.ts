// Plan-review fees: the schedule as data and its arithmetic in integer cents. Pure: no React,
// Next or database here; lib/fees/service.ts reads the schedule and writes invoices.
export * from "./compute";
export * from "./money";
export * from "./schedule";
