/**
 * Settings (server/src/config/env.ts): every variable is validated with a message naming it, and the
 * README's settings table lists every variable the server reads.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { jobSettings, loadConfig } from "../../../server/src/config/env";

const ROOT = join(import.meta.dirname, "..", "..", "..");
const saved = { ...process.env };
afterEach(() => {
  for (const k of Object.keys(process.env)) if (!(k in saved)) delete process.env[k];
  Object.assign(process.env, saved);
});

function withEnv(vars: Record<string, string>): () => unknown {
  return () => {
    Object.assign(process.env, vars);
    return loadConfig();
  };
}

describe("settings from the environment", () => {
  it.each([
    ["PORT", "http", "expected an integer in [0, 65535]"],
    ["LOG_LEVEL", "verbose", "expected one of fatal, error, warn, info, debug, trace, silent"],
    ["SMTP_SECURE", "yes", "expected true or false"],
    ["PUBLIC_URL", "tanglebank.example", "expected an http(s) URL"],
    ["TB_UPLOAD_MAX_BYTES", "12", "expected an integer in [1024,"],
    ["TB_UPLOAD_MAX_FILES", "0", "expected an integer in [1, 1000]"],
    ["TB_METRICS_THREADS", "two", "expected an integer in [1, 256]"],
    ["TB_METRICS_THREAD_NICE", "25", "expected an integer in [0, 19]"],
    ["TB_METRICS_CONCURRENCY", "0", "expected an integer in [1, 64]"],
    ["TB_METRICS_POLL_SECONDS", "0.1", "expected a number in [0.5, 3600]"],
    ["TB_METRICS_RETRY_DELAY_SECONDS", "-1", "expected an integer in [1,"],
    ["TB_METRICS_JOB_EXPIRE_SECONDS", "1.5", "expected an integer in [1,"],
    ["TB_METRICS_MAINTENANCE_SECONDS", "soon", "expected an integer in [1,"],
    ["TB_DOI_RETRY_LIMIT", "many", "expected an integer in [0, 1000]"],
    ["TB_DOI_RETRY_DELAY_SECONDS", "-5", "expected an integer in [0,"],
    ["TB_DOI", "yes", "expected on or off"],
  ])("%s=%s stops the start with a message naming the variable", (name, value, expected) => {
    expect(withEnv({ [name]: value })).toThrow(`Invalid environment variable ${name}=${JSON.stringify(value)}: ${expected}`);
  });

  it("reads valid values, and the job settings again on every call", () => {
    const cfg = withEnv({ LOG_LEVEL: "warn", SMTP_SECURE: "TRUE", PUBLIC_URL: "https://tanglebank.example/", TB_METRICS_POLL_SECONDS: "0.5", TB_METRICS_THREADS: "3" })() as ReturnType<typeof loadConfig>;
    expect(cfg.logLevel).toBe("warn");
    expect(cfg.smtp.secure).toBe(true);
    expect(cfg.publicUrl).toBe("https://tanglebank.example");
    expect(cfg.jobs).toMatchObject({ metricsPollSeconds: 0.5, metricsThreads: 3, metricsConcurrency: 2, doiRetryLimit: 10 });
    process.env.TB_METRICS_THREADS = "4";
    expect(jobSettings().metricsThreads).toBe(4);
  });

  it("the README's settings table lists every variable the server reads", () => {
    const source = readFileSync(join(ROOT, "server", "src", "config", "env.ts"), "utf8");
    const read = new Set<string>();
    for (const m of source.matchAll(/\b(?:int|num|str|onOff|trueFalse|oneOf)\("([A-Z][A-Z0-9_]+)"/g)) read.add(m[1]);
    for (const m of source.matchAll(/process\.env\.([A-Z][A-Z0-9_]+)/g)) read.add(m[1]);
    expect(read.size).toBeGreaterThan(30);
    const readme = readFileSync(join(ROOT, "README.md"), "utf8");
    const table = readme.slice(readme.indexOf("## Address, ports and settings"), readme.indexOf("## Deploying"));
    const rows = table.split("\n").filter((l) => l.startsWith("| `"));
    const listed = new Set(rows.flatMap((row) => [...row.split("|")[1].matchAll(/`([A-Z][A-Z0-9_]+)`/g)].map((m) => m[1])));
    expect([...read].filter((v) => !listed.has(v))).toEqual([]);
  });
});
