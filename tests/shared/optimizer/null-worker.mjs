// Entry of the worker thread used by significance.test.ts: Node 20 cannot start a worker from a .ts file
// directly, so this plain module loads the TypeScript worker through tsx's API.
import { tsImport } from "tsx/esm/api";

await tsImport("./null-worker.ts", import.meta.url);
