/** Folders of the checkout that the server reads: the built client and the public JSON Schemas. */
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

export const ROOT_DIR = join(dirname(fileURLToPath(import.meta.url)), "..", "..", "..");
export const CLIENT_DIST = join(ROOT_DIR, "client", "dist");
export const SCHEMAS_DIR = join(ROOT_DIR, "schemas");
