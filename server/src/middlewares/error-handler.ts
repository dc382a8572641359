import type { ErrorRequestHandler, RequestHandler } from "express";
import { UniqueConstraintError, ValidationError as SequelizeValidationError } from "sequelize";
import { MulterError } from "multer";
import { ApiError, GoneError } from "../lib/api-error";
import { config } from "../config/env";
import { DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from "../lib/db-errors";
import { formatBytes } from "../lib/upload-storage";

/** multer's refusals with the limit and the file named (its own messages name neither). */
function multerMessage(err: MulterError): { status: number; message: string; file?: string } {
  const cfg = config();
  const file = (err as MulterError & { filename?: string }).filename;
  switch (err.code) {
    case "LIMIT_FILE_SIZE":
      return { status: 413, file, message: `${file ? `"${file}"` : "A file"} is larger than the limit of ${formatBytes(cfg.uploadMaxBytes)} per file. Nothing was stored.` };
    case "LIMIT_FILE_COUNT":
      return { status: 413, file, message: `Too many files: at most ${cfg.uploadMaxFiles} files per upload${file ? ` ("${file}" is one too many)` : ""}; zip them or upload the rest separately. Nothing was stored.` };
    case "LIMIT_PART_COUNT":
    case "LIMIT_FIELD_COUNT":
      return { status: 400, message: "The upload has too many form fields. Nothing was stored." };
    case "LIMIT_FIELD_VALUE":
      return { status: 400, message: `The form field "${err.field ?? ""}" is too long. Nothing was stored.` };
    case "LIMIT_UNEXPECTED_FILE":
      return { status: 400, file, message: `Files go in the form field "files"; "${err.field ?? ""}" is not read. Nothing was stored.` };
    default:
      return { status: 400, file, message: `The upload could not be read: ${err.message}. Nothing was stored.` };
  }
}

/** JSON 404 for unknown API routes. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ code: "not_found", message: `No API route ${req.method} ${req.originalUrl}` });
};

/**
 * The one error pipeline. Mapping table:
 * GoneError (a withdrawn version) → 410 with the tombstone as the body; ApiError → its status; the
 * database unreachable (outage, restart, terminated connection) → 503 with a
 * plain message and Retry-After, never the driver's text; malformed JSON → 400; multer limits → 413/400;
 * unique constraint → 409; Sequelize validation → 422; other 4xx errors of Express/body-parser keep their
 * status; anything else → 500 without detail in production. Pages (outside /api) get the 503 as a short
 * HTML page.
 */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) {
    res.destroy();
    return;
  }
  if (err instanceof GoneError) {
    res.status(410).json({ code: err.code, message: err.message, ...err.tombstone });
    return;
  }
  if (err instanceof ApiError) {
    res.status(err.status).json({ code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err: { message: (err as Error)?.message, code: (err as { code?: unknown })?.code } }, "database unavailable");
    res.status(503).set("Retry-After", "10");
    if (req.originalUrl.startsWith("/api")) res.json({ code: "database_unavailable", message: DATABASE_UNAVAILABLE_MESSAGE });
    else res.type("html").send(`<!doctype html><html lang="en"><meta charset="utf-8"><title>Tanglebank: temporarily unavailable</title><body style="font-family:sans-serif;max-width:40rem;margin:4rem auto"><h1>Temporarily unavailable</h1><p>${DATABASE_UNAVAILABLE_MESSAGE}</p></body></html>`);
    return;
  }
  const e = err as { type?: string; status?: number; message?: string };
  if (e.type === "entity.parse.failed") {
    res.status(400).json({ code: "malformed_json", message: "The request body is not valid JSON." });
    return;
  }
  if (e.type === "entity.too.large") {
    res.status(413).json({ code: "too_large", message: "The request body is too large." });
    return;
  }
  if (err instanceof MulterError) {
    const m = multerMessage(err);
    res.status(m.status).json({ code: "upload_rejected", message: m.message, details: [{ ...(err.field ? { path: err.field } : {}), ...(m.file !== undefined ? { file: m.file } : {}), message: m.message }] });
    return;
  }
  if (err instanceof UniqueConstraintError) {
    res.status(409).json({ code: "conflict", message: "This already exists.", details: err.errors.map((x) => ({ path: x.path ?? undefined, message: x.message })) });
    return;
  }
  if (err instanceof SequelizeValidationError) {
    res.status(422).json({ code: "validation_failed", message: "Invalid data.", details: err.errors.map((x) => ({ path: x.path ?? undefined, message: x.message })) });
    return;
  }
  // Other client errors raised by Express and body-parser (a path that is not valid percent-encoding, an
  // unsupported charset or encoding, an aborted body…) keep their 4xx status: they are the caller's fault.
  if (typeof e.status === "number" && e.status >= 400 && e.status < 500) {
    const exposed = (err as { expose?: boolean }).expose === true;
    res.status(e.status).json({ code: e.status === 415 ? "unsupported_media_type" : "bad_request", message: exposed && e.message ? e.message : "The request could not be read." });
    return;
  }
  req.log?.error({ err }, "unhandled error");
  const production = config().nodeEnv === "production";
  res.status(500).json({ code: "internal", message: production ? "Something went wrong on our side." : String(e.message ?? err) });
};
