export * from "./errors";
export * from "./parse";
export * from "./serialize";
export * from "./write";
export { detectDelimiter, decodeUtf8 } from "./text";
export { detectSignature, signatureAdvice, type FileSignature, type FileType } from "./signature";
