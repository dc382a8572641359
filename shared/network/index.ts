/**
 * Public API of the analysis engine (pure TypeScript: runs in the browser and in server worker threads).
 * See README.md for formulas, references and the edge-case decisions.
 */
export * from "./types";
export * from "./random";
export * from "./errors";
export * from "./graph";
export * from "./parse/index";
export * from "./metrics/basic";
export * from "./modularity/quality";
export * from "./null-models/index";
export * from "./roles/roles";
export * from "./nestedness/nodf";
export * from "./optimizer/index";
