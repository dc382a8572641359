/**
 * The transport: fetch JSON from /api/v1, attach the CSRF token to state-changing requests, and turn
 * error responses into ApiClientError({ status, code, message, details }). No toasts, no redirects:
 * callers show errors through query state.
 */
import type { ApiErrorBody, ErrorDetail } from "@shared/types/api";

export class ApiClientError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: ErrorDetail[],
  ) {
    super(message);
  }
}

let csrfToken: string | null = null;
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

async function ensureCsrf(): Promise<string | null> {
  if (csrfToken) return csrfToken;
  const res = await fetch("/api/v1/auth/session", { credentials: "same-origin" });
  if (res.ok) {
    const body = (await res.json()) as { csrfToken?: string };
    csrfToken = body.csrfToken ?? null;
  }
  return csrfToken;
}

export async function apiFetch<T>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const method = (init.method ?? "GET").toUpperCase();
  const headers = new Headers(init.headers);
  headers.set("accept", "application/json");
  let body = init.body;
  if (init.json !== undefined) {
    headers.set("content-type", "application/json");
    body = JSON.stringify(init.json);
  }
  if (!["GET", "HEAD"].includes(method)) {
    const token = await ensureCsrf();
    if (token) headers.set("x-csrf-token", token);
  }
  const res = await fetch(`/api/v1${path}`, { ...init, method, headers, body, credentials: "same-origin" });
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  let data: unknown;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    data = null;
  }
  if (!res.ok) {
    const e = (data ?? {}) as Partial<ApiErrorBody>;
    if (e.code === "csrf_failed") csrfToken = null;
    throw new ApiClientError(res.status, e.code ?? "http_error", e.message ?? `Request failed with status ${res.status}`, e.details);
  }
  return data as T;
}
