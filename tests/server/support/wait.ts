/** Polls `probe` until it returns a truthy value (returned) or the time runs out (throws naming `what`). */
export async function waitFor<T>(probe: () => Promise<T | undefined | false>, what: string, timeoutMs = 45_000, everyMs = 200): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
