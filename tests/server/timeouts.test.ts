/**
 * Connection time limits (server/src/index.ts applyTimeouts): a request whose body stops arriving is
 * answered 408 naming the idle limit within about that limit, not after minutes.
 */
import { connect } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { resetConfig } from "../../server/src/config/env";
import { shutdownServerResources, startServer } from "../../server/src/index";

let srv: Awaited<ReturnType<typeof startServer>>;
let port = 0;

beforeAll(async () => {
  process.env.TB_IDLE_TIMEOUT_SECONDS = "1";
  resetConfig();
  srv = await startServer(0, "127.0.0.1");
  port = Number(new URL(srv.url).port);
});
afterAll(async () => {
  delete process.env.TB_IDLE_TIMEOUT_SECONDS;
  resetConfig();
  await srv.close();
  await shutdownServerResources();
});

/** Sends `text` on a raw connection and returns everything the server sends until it closes. */
function raw(text: string): Promise<{ answer: string; ms: number }> {
  return new Promise((resolve, reject) => {
    const t0 = Date.now();
    const s = connect(port, "127.0.0.1", () => s.write(text));
    let answer = "";
    s.on("data", (d: Buffer) => (answer += d.toString()));
    s.on("close", () => resolve({ answer, ms: Date.now() - t0 }));
    s.on("error", reject);
    s.setTimeout(20_000, () => {
      s.destroy();
      reject(new Error(`no answer within 20 s; got ${JSON.stringify(answer)}`));
    });
  });
}

describe("a client that stops sending", () => {
  it("gets 408 for a JSON body that stops half way", async () => {
    const { answer, ms } = await raw(`POST /api/v1/bundles/estimate HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: 500\r\n\r\n{"refs": ["TB-0000`);
    expect(answer).toMatch(/^HTTP\/1\.1 408 Request Timeout/);
    expect(answer).toMatch(/"code":"request_timeout"/);
    expect(answer).toMatch(/idle limit/);
    expect(ms).toBeGreaterThanOrEqual(900);
    expect(ms).toBeLessThan(10_000);
  });
});
