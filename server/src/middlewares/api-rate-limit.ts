/**
 * Rate limit on the public read API (catalogue, networks, bundles): per personal API token when a Bearer
 * token is sent, otherwise per client IP. Built with the shared factory (draft-8 `RateLimit` headers, JSON
 * 429). `config().apiRateLimit` requests per minute (TB_API_RATE_LIMIT).
 */
import { ipKeyGenerator } from "express-rate-limit";
import { config } from "../config/env";
import { createRateLimiter } from "./rate-limit";

export const apiRateLimit = createRateLimiter({
  what: "API requests",
  limit: () => config().apiRateLimit,
  windowMs: 60_000,
  key: (req) => (req.apiTokenId ? `token:${req.apiTokenId}` : `ip:${ipKeyGenerator(req.ip ?? "unknown")}`),
});
