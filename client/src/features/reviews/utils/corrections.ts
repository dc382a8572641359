/** Which metadata a curator may correct on the review page, by the version's state. */
import type { ReviewDetail } from "../api/types";

/**
 * Curators correct metadata while a version is under review; a published version's study metadata too (its
 * networks' metadata stay as published, as the API answers: a new version changes them).
 */
export function canCorrect(r: Pick<ReviewDetail, "version">, what: "study" | "network"): boolean {
  return r.version.state === "submitted" || r.version.state === "changes_requested" || (what === "study" && r.version.state === "published");
}
