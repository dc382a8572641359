// Entry of the metrics worker threads when the server runs from its TypeScript source (development and
// tests): Node 20 cannot start a worker from a .ts file, so this plain module loads metrics-thread.ts
// through tsx's API. The compiled server (`npm run build`) has its own dist/server/metrics-thread.mjs.
import { tsImport } from "tsx/esm/api";

const thread = await tsImport("./metrics-thread.ts", import.meta.url);

export default thread.default;
