import { ApiError } from "../../lib/api-error";

/** A token's name: 1–80 characters, so the owner can tell tokens apart. */
export function parseTokenName(body: unknown): string {
  const name = body && typeof body === "object" ? (body as Record<string, unknown>).name : undefined;
  if (typeof name !== "string" || name.trim() === "") {
    throw ApiError.unprocessable("Give the token a name.", [{ path: "/name", message: "required: a name such as “R scripts on my laptop”" }]);
  }
  if (name.trim().length > 80) throw ApiError.unprocessable("The name is too long.", [{ path: "/name", message: "at most 80 characters" }]);
  return name.trim();
}

export function parseTokenId(raw: string): number {
  if (!/^\d{1,9}$/.test(raw)) throw ApiError.notFound("No such token.");
  return Number(raw);
}
