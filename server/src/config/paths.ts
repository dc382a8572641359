/** Folders of the checkout that the server reads: the built client and the public JSON Schemas. */
import { existsSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

/**
 * The checkout's root: the nearest folder above this module holding package.json. The same code runs
 * from its source (server/src/config/) and compiled into one file per entry (dist/server/).
 */
function findRoot(from: string): string {
  for (let dir = from; ; dir = dirname(dir)) {
    if (existsSync(join(dir, "package.json"))) return dir;
    if (dirname(dir) === dir) throw new Error(`No package.json above ${from}: cannot find the Tanglebank checkout`);
  }
}

export const ROOT_DIR = findRoot(dirname(fileURLToPath(import.meta.url)));
export const CLIENT_DIST = join(ROOT_DIR, "client", "dist");
export const SCHEMAS_DIR = join(ROOT_DIR, "schemas");
