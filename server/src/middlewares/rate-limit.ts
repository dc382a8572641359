/**
 * Rate limiting (express-rate-limit, IETF draft-8 `RateLimit` headers, no legacy `X-RateLimit-*`).
 * `createRateLimiter()` is the factory every feature uses: the limit may be a function read per request,
 * so tests can lower it through the environment and `resetConfig()`; the key defaults to the client IP.
 * Answers past the limit are the usual JSON error `{ code: "rate_limited", message }` with status 429.
 */
import type { Request, RequestHandler } from "express";
import { rateLimit, ipKeyGenerator, MemoryStore, type Options } from "express-rate-limit";
import { config } from "../config/env";

export interface RateLimiterOptions {
  /** A short name used in the error message (e.g. "sign-in attempts"). */
  what: string;
  /** Requests allowed per window; a function is read on every request. */
  limit: number | ((req: Request) => number);
  windowMs?: number;
  /** Defaults to the client IP (IPv6 grouped by /56 as express-rate-limit recommends). */
  key?: (req: Request) => string;
  /** Count only failed requests (status >= 400), e.g. for sign-in. */
  skipSuccessfulRequests?: boolean;
  /** Who is counted, for the message (default "from this address"). */
  whom?: string;
}

const stores: MemoryStore[] = [];

/** Builds a rate-limiting middleware. */
export function createRateLimiter(opts: RateLimiterOptions): RequestHandler {
  const windowMs = opts.windowMs ?? 15 * 60 * 1000;
  const store = new MemoryStore();
  stores.push(store);
  const options: Partial<Options> = {
    windowMs,
    limit: typeof opts.limit === "function" ? (req) => (opts.limit as (r: Request) => number)(req) : opts.limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    store,
    skipSuccessfulRequests: opts.skipSuccessfulRequests ?? false,
    keyGenerator: opts.key ?? ((req) => ipKeyGenerator(req.ip ?? "unknown")),
    handler: (_req, res, _next, o) => {
      const minutes = Math.max(1, Math.round(windowMs / 60000));
      res.status(o.statusCode).json({
        code: "rate_limited",
        message: `Too many ${opts.what} ${opts.whom ?? "from this address"}. Wait up to ${minutes} minute${minutes === 1 ? "" : "s"} and try again.`,
      });
    },
  };
  return rateLimit(options);
}

/**
 * Failed sign-ins are counted per account AND address together (`TB_AUTH_RATE_LIMIT` per 15 minutes), so
 * guessing one person's password is stopped without locking out everyone else behind the same address (a
 * campus NAT); a ceiling of ten times that per address bounds guessing across many accounts.
 */
export const signInRateLimit: RequestHandler[] = [
  createRateLimiter({
    what: "failed sign-in attempts",
    whom: "for this account from this address",
    limit: () => config().authRateLimit,
    skipSuccessfulRequests: true,
    key: (req) => {
      const email = (req.body as { email?: unknown } | undefined)?.email;
      return `${ipKeyGenerator(req.ip ?? "unknown")}|${typeof email === "string" ? email.trim().toLowerCase() : ""}`;
    },
  }),
  createRateLimiter({ what: "failed sign-in attempts", limit: () => 10 * config().authRateLimit, skipSuccessfulRequests: true }),
];
/** Sign-ups per IP (`TB_AUTH_RATE_LIMIT` per 15 minutes). */
export const signUpRateLimit = createRateLimiter({ what: "sign-ups", limit: () => config().authRateLimit });
/** Requests that send an e-mail (password reset, new verification link) per IP. */
export const authMailRateLimit = createRateLimiter({ what: "e-mail requests", limit: () => config().authRateLimit });

/** Forgets every counter (tests). */
export async function resetRateLimits(): Promise<void> {
  await Promise.all(stores.map((s) => s.resetAll()));
}
