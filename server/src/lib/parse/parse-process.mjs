// Entry of the parse processes when the server runs from its TypeScript source (development and tests):
// Node 20 cannot start a .ts file, so this plain module loads parse-process.ts through tsx's API. The
// compiled server (`npm run build`) has its own dist/server/parse-process.mjs.
import { tsImport } from "tsx/esm/api";

await tsImport("./parse-process.ts", import.meta.url);
