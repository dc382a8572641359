/**
 * Schema fragments that several resources' request schemas (`<resource>.schemas.ts`) share: the parts of
 * a network's address (accession, version, position) and positive integer ids. Mounted through
 * validate() (middlewares/validate.ts) and described in the OpenAPI document from the same objects.
 */
import type { FieldSchema, ObjectSchema } from "../middlewares/validate";

/** Largest id a PostgreSQL integer column holds. */
export const MAX_ID = 2147483647;

/** A dataset's accession, `TB-` and six digits. */
export const accession: FieldSchema = {
  type: "string",
  pattern: "^TB-[0-9]{6}$",
  title: "dataset",
  form: "accessions look like TB-000042",
  description: "Dataset accession",
  example: "TB-000001",
};

/** A version in a network's address: `v2` (or `2`); the handler reads its number with versionNumber(). */
export const versionRef: FieldSchema = {
  type: "string",
  pattern: "^v?(?!0+$)[0-9]{1,6}$",
  title: "version",
  form: "versions are written v1, v2, …",
  description: "Version, written v1, v2, …",
  example: "v1",
};

/** A version number (1, 2, …). */
export const versionInt: FieldSchema = {
  type: "integer",
  minimum: 1,
  maximum: 999999,
  title: "version",
  form: "versions are numbered 1, 2, …",
  description: "Version number",
  example: 1,
};

/** A network's number within its version (1, 2, …). */
export const position: FieldSchema = {
  type: "integer",
  minimum: 1,
  maximum: 999999,
  title: "network",
  form: "networks are numbered 1, 2, …",
  description: "Network number within the version (1, 2, …)",
  example: 1,
};

/** A positive integer id of `title` (a path parameter's 404 names it: "No such message"). */
export function idField(title: string, description = `The ${title}'s id`): FieldSchema {
  return { type: "integer", minimum: 1, maximum: MAX_ID, title, description, example: 1 };
}

/** Path parameters: one id named `name`. */
export function idParams(title: string, name = "id"): ObjectSchema {
  return { type: "object", properties: { [name]: idField(title) }, required: [name] };
}

/** Path parameters of a network's address: /:accession/:version/:position. */
export const networkRefParams: ObjectSchema = {
  type: "object",
  properties: { accession, version: versionRef, position },
  required: ["accession", "version", "position"],
};

/** Path parameters of a dataset version's address: /:accession/:version (v2 or 2). */
export const versionRefParams: ObjectSchema = {
  type: "object",
  properties: { accession, version: versionRef },
  required: ["accession", "version"],
};

/** A network reference, accession/version/network: TB-000042/v2/3 (no version or network 0, as versionRef and position). */
export const NETWORK_REF_PATTERN = "^TB-[0-9]{6}/v(?!0+/)[0-9]{1,6}/(?!0+$)[0-9]{1,6}$";

/** A network reference as an item of a list (its title names the items in a list's rule). */
export const networkRefItem: FieldSchema = {
  type: "string",
  pattern: NETWORK_REF_PATTERN,
  title: "network references such as TB-000042/v2/3",
  description: "A network reference: accession/version/network",
  example: "TB-000001/v1/1",
  "x-rule": "must be a network reference such as TB-000042/v2/3.",
};

/** A collection's code, `TBC-` and six digits. */
export const collectionCode: FieldSchema = {
  type: "string",
  pattern: "^TBC-[0-9]{6}$",
  title: "collection",
  form: "collection codes look like TBC-000001",
  description: "Collection code",
  example: "TBC-000001",
};

/** Path parameters: one accession. */
export const accessionParams: ObjectSchema = { type: "object", properties: { accession }, required: ["accession"] };

/** The number of a version reference that `versionRef` accepted ("v2" → 2). */
export function versionNumber(ref: string | number): number {
  return typeof ref === "number" ? ref : Number(String(ref).replace(/^v/, ""));
}

/** The address parts a route with `networkRefParams` reads, as validate() left them. */
export interface NetworkRef {
  accession: string;
  version: number;
  position: number;
}

export function networkRefOf(params: Record<string, unknown>): NetworkRef {
  return { accession: String(params.accession), version: versionNumber(params.version as string), position: Number(params.position) };
}
