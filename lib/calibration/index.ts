/** Calibration of a planting's crop curve against its soil checks: pure functions, no I/O. */
export * from "./stats";
export * from "./search";
export * from "./kc-scale";
