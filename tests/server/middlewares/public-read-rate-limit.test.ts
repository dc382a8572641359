/**
 * The public read API's rate limit (TB_API_RATE_LIMIT per minute, per token or IP) covers the dataset
 * reads and the network views as well as the catalogue, networks and bundles.
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetConfig } from "../../../server/src/config/env";
import { resetRateLimits } from "../../../server/src/middlewares/rate-limit";
import { resetDatabase } from "../../setup/db";

const app = createApp();

beforeAll(async () => {
  await resetDatabase();
  process.env.TB_API_RATE_LIMIT = "2";
  resetConfig();
});
afterAll(async () => {
  delete process.env.TB_API_RATE_LIMIT;
  resetConfig();
  await resetRateLimits();
  await shutdownServerResources();
});

describe("public read rate limit", () => {
  it.each([
    ["dataset", "/api/v1/datasets/TB-999999"],
    ["dataset version", "/api/v1/datasets/TB-999999/versions/1"],
    ["original file", "/api/v1/datasets/TB-999999/versions/1/networks/1/file"],
    ["network view", "/api/v1/network-views/TB-999999/v1/1"],
    ["partition", "/api/v1/network-views/TB-999999/v1/1/partition.csv"],
    ["coverage map", "/api/v1/network-views/map"],
    ["compare rows", "/api/v1/network-views/summaries?refs=TB-999999/v1/1"],
  ])("%s: the third request in a minute answers 429 with RateLimit headers", async (_name, path) => {
    await resetRateLimits();
    const codes: number[] = [];
    let last: request.Response | undefined;
    for (let i = 0; i < 3; i++) {
      last = await request(app).get(path);
      codes.push(last.status);
    }
    expect(codes[0]).not.toBe(429);
    expect(codes[1]).not.toBe(429);
    expect(codes[2]).toBe(429);
    expect(last!.body.code).toBe("rate_limited");
    expect(last!.headers["ratelimit-policy"]).toMatch(/q=2/);
  });
});
