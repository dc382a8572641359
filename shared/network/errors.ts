/**
 * Typed errors of the analysis engine's metrics, null models and roles (parsing has its own
 * `NetworkParseError` in ./parse/errors.ts, which names file, row and column).
 *
 * A figure that is undefined for a network (e.g. modularity of an edge-less network) is signalled by a
 * `NetworkEngineError` with a stable `code`; callers that store "null with a reason" catch it and keep
 * `code` and `message`.
 */
export type NetworkEngineErrorCode =
  /** The network has no links (total weight 0): modularity, roles and null models are undefined. */
  | "no-links"
  /** The partition has the wrong length or a module number that is not an integer in [0, nodes). */
  | "bad-partition"
  /** The objective does not apply to this kind of network (e.g. Barber's Q_B on a one-mode network). */
  | "objective-mismatch"
  /** The method is not defined for this kind of network (e.g. Patefield on an undirected one-mode network). */
  | "unsupported"
  /** Patefield's algorithm needs integer weights; rounding was not allowed. */
  | "non-integer-weights"
  /** The network object breaks the canonical CSR invariants (see types.ts). */
  | "bad-network"
  /** An option is out of its range. */
  | "bad-option";

export class NetworkEngineError extends Error {
  readonly code: NetworkEngineErrorCode;
  constructor(code: NetworkEngineErrorCode, message: string) {
    super(message);
    this.name = "NetworkEngineError";
    this.code = code;
  }
}
