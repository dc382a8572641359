/** A typed error that services throw; the error handler maps it to `{ code, message, details }`. */
import type { Tombstone } from "@shared/types/network-view";
import type { ErrorDetail } from "@shared/types/api";

export type { ErrorDetail };

export class ApiError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: ErrorDetail[],
  ) {
    super(message);
    this.name = "ApiError";
  }

  static badRequest(message: string, details?: ApiError["details"]) {
    return new ApiError(400, "bad_request", message, details);
  }
  static unauthorized(message = "Sign in to do this.") {
    return new ApiError(401, "unauthorized", message);
  }
  static forbidden(message = "Your role does not allow this.") {
    return new ApiError(403, "forbidden", message);
  }
  static notFound(message = "Not found.") {
    return new ApiError(404, "not_found", message);
  }
  static conflict(message: string, details?: ApiError["details"]) {
    return new ApiError(409, "conflict", message, details);
  }
  static unprocessable(message: string, details?: ApiError["details"]) {
    return new ApiError(422, "validation_failed", message, details);
  }
}

/**
 * 410 Gone for a withdrawn dataset version. Every read path that reaches a withdrawn version throws it
 * (datasets, networks, network views, files), and the error handler answers
 * `{ code: "withdrawn", message, ...tombstone }`: the tombstone itself is the body, the same everywhere.
 */
export class GoneError extends ApiError {
  constructor(public readonly tombstone: Tombstone) {
    super(410, "withdrawn", `${tombstone.accession} v${tombstone.version} was withdrawn: ${tombstone.reason}`);
  }
}
