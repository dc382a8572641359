/** Metadata validation shared by server and client: human messages, the browser validator, cross-field rules, public coordinates. */
export * from "./messages";
export * from "./mini-validator";
export * from "./cross-checks";
export * from "./coordinates";
export * from "./not-recorded";
export * from "./doi";
