// Entry of a parse process (lib/parse/pool.ts): reads uploaded network files outside the web server's
// process. Node 20 cannot start a .ts file directly, so this plain module loads the TypeScript task
// through tsx's API, says it is ready, then answers one task at a time.
import process from "node:process";
import { tsImport } from "tsx/esm/api";

const task = await tsImport("./task.ts", import.meta.url);
process.on("message", async (m) => {
  try {
    const result = await task.runParseTask(m.task);
    process.send({ id: m.id, result });
  } catch (err) {
    process.send({ id: m.id, error: String(err && err.message ? err.message : err) });
  }
});
process.on("disconnect", () => process.exit(0));
process.send({ ready: true });
