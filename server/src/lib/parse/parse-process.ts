/**
 * The body of a parse process (./pool.ts): reads uploaded network files outside the web server's
 * process, one task at a time, and says when it is ready. The pool starts `parse-process.mjs` beside the
 * module that creates it: from the source, the plain module of that name here loads this file through
 * tsx; `npm run build` compiles this file to dist/server/parse-process.mjs, beside the compiled server.
 */
import process from "node:process";
import { runParseTask, type ParseTask } from "./task";

process.on("message", (m: { id: number; task: ParseTask }) => {
  runParseTask(m.task).then(
    (result) => process.send?.({ id: m.id, result }),
    (err: unknown) => process.send?.({ id: m.id, error: String((err as Error)?.message ?? err) }),
  );
});
process.on("disconnect", () => process.exit(0));
process.send?.({ ready: true });
