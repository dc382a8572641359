export * from "./errors";
export * from "./parse";
export * from "./serialize";
export * from "./write";
export { detectDelimiter, decodeUtf8 } from "./text";
