/**
 * The one body-parsing layer of the API: every request body is read here, and what the routes cannot
 * trust is refused before any of them sees it, with a 400 (or 415) saying what is wrong and where:
 * - a body in a type the API does not read (XML, form-encoded, text…) → 415; JSON and multipart only;
 * - JSON that is not an object at the top (an array, a bare string or number) → 400;
 * - keys `__proto__`, `constructor`, `prototype` anywhere (prototype pollution; such a key stored in
 *   metadata made a draft that could not be opened again) → 400 naming the path;
 * - nesting deeper than MAX_BODY_DEPTH → 400 (JSON.parse copes, recursive code after it would not);
 * - a NUL character in any string or key (PostgreSQL's text and JSONB cannot hold it) → 400 naming the path;
 * - malformed JSON → 400, a body over the limit → 413 (error-handler.ts).
 * Multipart form fields pass the same checks once multer has read them (checkBodyValue).
 */
import express, { type RequestHandler } from "express";
import { ApiError } from "../lib/api-error";

export const MAX_BODY_DEPTH = 32;
const FORBIDDEN_KEYS = new Set(["__proto__", "constructor", "prototype"]);
const WRITE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

function pointer(path: Array<string | number>): string {
  return path.length ? "/" + path.map((p) => String(p).replace(/~/g, "~0").replace(/\//g, "~1")).join("/") : "/";
}

/** The first problem of a parsed body (walked without recursion), or null. */
export function bodyProblem(value: unknown): ApiError | null {
  const stack: Array<{ v: unknown; path: Array<string | number> }> = [{ v: value, path: [] }];
  while (stack.length) {
    const { v, path } = stack.pop()!;
    if (typeof v === "string") {
      if (v.includes("\u0000")) return ApiError.badRequest(`The request body holds a NUL character at ${pointer(path)}; remove it.`, [{ path: pointer(path), message: "NUL characters (U+0000) are not accepted in text." }]);
      continue;
    }
    if (!v || typeof v !== "object") continue;
    if (path.length >= MAX_BODY_DEPTH) return ApiError.badRequest(`The request body is nested more than ${MAX_BODY_DEPTH} levels deep (at ${pointer(path.slice(0, 8))}…).`, [{ path: pointer(path.slice(0, 8)), message: `At most ${MAX_BODY_DEPTH} levels of nesting.` }]);
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], path: [...path, i] });
      continue;
    }
    for (const k of Object.keys(v)) {
      if (FORBIDDEN_KEYS.has(k)) return ApiError.badRequest(`The key "${k}" is not accepted in a request body (at ${pointer([...path, k])}).`, [{ path: pointer([...path, k]), message: `"${k}" is reserved; use another name.` }]);
      if (k.includes("\u0000")) return ApiError.badRequest(`A key of the request body holds a NUL character (at ${pointer(path)}).`, [{ path: pointer(path), message: "NUL characters (U+0000) are not accepted in keys." }]);
      stack.push({ v: (v as Record<string, unknown>)[k], path: [...path, k] });
    }
  }
  return null;
}

/** Throws the first problem of a value read from a request (multipart fields, JSON inside a field). */
export function checkBodyValue(value: unknown): void {
  const p = bodyProblem(value);
  if (p) throw p;
}

function hasBody(req: Parameters<RequestHandler>[0]): boolean {
  const len = req.headers["content-length"];
  if (len !== undefined) return Number(len) > 0;
  return req.headers["transfer-encoding"] !== undefined;
}

/** The API's body parsing: JSON (up to `limit`) checked as above; multipart left to the upload routes. */
export function apiBody(limit = "2mb"): RequestHandler[] {
  const json = express.json({ limit });
  const guard: RequestHandler = (req, _res, next) => {
    if (!WRITE_METHODS.has(req.method) || !hasBody(req)) return next();
    if (req.is("application/json") || req.is("multipart/form-data")) return next();
    const type = req.headers["content-type"];
    next(new ApiError(415, "unsupported_media_type", `The API reads JSON bodies (Content-Type: application/json)${req.method === "POST" ? " and, for uploads, multipart/form-data" : ""}; this body is ${type ? `"${type.split(";")[0]}"` : "untyped"}.`));
  };
  const check: RequestHandler = (req, _res, next) => {
    if (!req.is("application/json") || req.body === undefined) return next();
    const b = req.body as unknown;
    if (!b || typeof b !== "object" || Array.isArray(b)) {
      return next(ApiError.badRequest(`The request body must be a JSON object ({…}), not ${Array.isArray(b) ? "an array" : b === null ? "null" : `a ${typeof b}`}.`, [{ path: "/", message: "A JSON object." }]));
    }
    next(bodyProblem(b) ?? undefined);
  };
  return [guard, json, check];
}
