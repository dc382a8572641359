/**
 * Version of the analysis engine, stored with every computed result so that a figure can be traced to the
 * code that produced it. Bump the minor version when an algorithm change can alter results for the same
 * input, settings and seed; bump the major version when the result format changes.
 */
export const ENGINE_VERSION = "tanglebank-engine 2.1.0";
