/**
 * Pipeline settings: what the metrics pipeline computes for every network, their defaults, validation, the
 * settings hash that keys each result, and the current settings (table app_settings, key "metrics.settings").
 *
 * Settings hash = sha256 of the canonical JSON (keys sorted) of { engine: ENGINE_VERSION, settings }: a
 * result is reused only for the same settings computed by the same engine version.
 */
import { createHash } from "node:crypto";
import type { Transaction } from "sequelize";
import { NULL_DATA_KIND_LABEL, NULL_MODELS as ENGINE_NULL_MODELS, NULL_MODEL_INFO, nullModelLabel, type NullDataKind } from "@shared/network/null-models/index";
import { ENGINE_VERSION } from "@shared/network/version";
import type { PipelineSettings } from "@shared/types/pipeline";
import { sequelize } from "../db/sequelize";
import type { ErrorDetail } from "../lib/api-error";

export const SETTINGS_KEY = "metrics.settings";

/**
 * Engine defaults (shared/network/analyze.ts ANALYZE_DEFAULTS): 20 restarts, the standard null models of
 * each network's kind (fixed degrees first, as primary) with 100 replicates each, seed 1.
 */
export const DEFAULT_PIPELINE_SETTINGS: PipelineSettings = Object.freeze({
  objective: "auto",
  restarts: 20,
  nullModels: "standard",
  nulls: 100,
  seed: 1,
  annealing: "auto",
}) as PipelineSettings;

export const OBJECTIVES = ["auto", "newman", "newman-directed", "barber"] as const;
export const ANNEALING = ["auto", "on", "off"] as const;

function canonicalJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(",")}]`;
  if (v && typeof v === "object") {
    const o = v as Record<string, unknown>;
    return `{${Object.keys(o)
      .sort()
      .filter((k) => o[k] !== undefined)
      .map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v);
}

export function settingsHash(s: PipelineSettings): string {
  const clean = normalizeSettings(s);
  return createHash("sha256").update(canonicalJson({ engine: ENGINE_VERSION, settings: clean })).digest("hex");
}

/** Keeps only the known fields, in a fixed shape. */
export function normalizeSettings(s: PipelineSettings): PipelineSettings {
  return {
    objective: s.objective,
    restarts: s.restarts,
    nullModels: s.nullModels === "standard" ? "standard" : [...s.nullModels],
    nulls: s.nulls,
    seed: s.seed,
    annealing: s.annealing,
  };
}

/**
 * Validates a (partial) settings object over `base`; returns the full settings or the list of problems
 * (JSON-pointer paths) for a 400 answer.
 */
export function validateSettings(input: unknown, base: PipelineSettings = DEFAULT_PIPELINE_SETTINGS): { settings?: PipelineSettings; errors: ErrorDetail[] } {
  const errors: ErrorDetail[] = [];
  if (!input || typeof input !== "object" || Array.isArray(input)) {
    return { errors: [{ path: "/", message: "settings must be an object" }] };
  }
  const o = input as Record<string, unknown>;
  // "nullModel" is the single-model field of settings stored before null-model sets ("auto" = standard).
  const known = new Set(["objective", "restarts", "nullModels", "nullModel", "nulls", "seed", "annealing"]);
  for (const k of Object.keys(o)) if (!known.has(k)) errors.push({ path: `/${k}`, message: `unknown setting "${k}"` });
  const out: PipelineSettings = { ...base };
  const oneOf = <T extends string>(k: keyof PipelineSettings, allowed: readonly T[]) => {
    if (o[k] === undefined) return;
    if (typeof o[k] !== "string" || !allowed.includes(o[k] as T)) {
      errors.push({ path: `/${k}`, message: `must be one of ${allowed.join(", ")}` });
    } else (out as unknown as Record<string, unknown>)[k] = o[k];
  };
  const int = (k: keyof PipelineSettings, min: number, max: number) => {
    if (o[k] === undefined) return;
    const v = o[k];
    if (typeof v !== "number" || !Number.isInteger(v) || v < min || v > max) {
      errors.push({ path: `/${k}`, message: `must be an integer from ${min} to ${max}` });
    } else (out as unknown as Record<string, unknown>)[k] = v;
  };
  oneOf("objective", OBJECTIVES);
  const models = ENGINE_NULL_MODELS as readonly string[];
  if (o.nullModels !== undefined) {
    const v = o.nullModels;
    if (v === "standard") out.nullModels = "standard";
    else if (!Array.isArray(v) || v.length === 0 || v.length > models.length || v.some((m) => typeof m !== "string" || !models.includes(m)) || new Set(v).size !== v.length) {
      errors.push({ path: "/nullModels", message: `must be "standard" or a list of different null models from ${models.join(", ")} (the first is the primary)` });
    } else out.nullModels = v as PipelineSettings["nullModels"];
  } else if (o.nullModel !== undefined) {
    if (o.nullModel === "auto") out.nullModels = "standard";
    else if (typeof o.nullModel === "string" && models.includes(o.nullModel)) out.nullModels = [o.nullModel] as PipelineSettings["nullModels"];
    else errors.push({ path: "/nullModel", message: `must be one of ${models.join(", ")} (or use nullModels)` });
  }
  oneOf("annealing", ANNEALING);
  int("restarts", 1, 1000);
  int("nulls", 0, 10000);
  int("seed", 0, 0xffffffff);
  return errors.length ? { errors } : { settings: out, errors };
}

export async function getPipelineSettings(transaction?: Transaction): Promise<PipelineSettings> {
  const [rows] = (await sequelize().query(`SELECT value FROM app_settings WHERE key = :key`, {
    replacements: { key: SETTINGS_KEY },
    transaction,
  })) as [Array<{ value: unknown }>, unknown];
  if (!rows.length) return { ...DEFAULT_PIPELINE_SETTINGS };
  const { settings } = validateSettings(rows[0].value);
  return settings ?? { ...DEFAULT_PIPELINE_SETTINGS };
}

export async function setPipelineSettings(s: PipelineSettings, transaction?: Transaction): Promise<void> {
  await sequelize().query(
    `INSERT INTO app_settings (key, value, updated_at, created_at) VALUES (:key, CAST(:value AS jsonb), now(), now())
     ON CONFLICT (key) DO UPDATE SET value = EXCLUDED.value, updated_at = now()`,
    { replacements: { key: SETTINGS_KEY, value: JSON.stringify(normalizeSettings(s)) }, transaction },
  );
}

/** The standard set of null models of each kind of data, primary first (shared/network/null-models). */
export const STANDARD_NULL_SETS: Record<NullDataKind, string[]> = {
  "binary-bipartite": ["curveball", "probabilistic", "er"],
  "integer-bipartite": ["curveball", "totals-connectance", "er"],
  "real-bipartite": ["curveball", "weight-shuffle", "er"],
  "one-mode-undirected": ["curveball", "er"],
  directed: ["curveball", "totals-connectance (integer counts only)", "er"],
};

/** The null-model setting in words, for READMEs and pages (never a placeholder). */
export function nullModelsText(s: PipelineSettings): string {
  if (s.nullModels === "standard") {
    return (Object.keys(STANDARD_NULL_SETS) as NullDataKind[])
      .map((k) => `${NULL_DATA_KIND_LABEL[k]}: ${STANDARD_NULL_SETS[k].join(", ")}`)
      .join("; ") + " (the first of each set is the primary null)";
  }
  return s.nullModels.map((m, i) => `${nullModelLabel(m)}${i === 0 ? " (primary)" : ""}`).join(", ");
}

/** One line per null model: what it keeps and what it does not (README texts). */
export function nullModelGlossary(): string[] {
  return ENGINE_NULL_MODELS.map((m) => {
    const i = NULL_MODEL_INFO[m];
    return `${m} — ${i.title}. Keeps ${i.keeps}. Does not keep ${i.doesNotKeep}.${i.liberal ? ` Liberal: ${i.caution}.` : ` Note: ${i.caution}.`} Source: ${i.source}.`;
  });
}
