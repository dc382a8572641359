/** To the depositor: a curator's decision on their submission, or a withdrawal. */
import type { EmailContent } from "../mailer";
import { reviewEmail } from "./review-layout";
import { doiUrl } from "@shared/citation";

export type DecisionKind = "publish" | "request_changes" | "decline" | "withdraw";

export function reviewDecisionEmail(d: {
  kind: DecisionKind;
  title: string;
  versionNumber: number;
  accession: string | null;
  comment: string | null;
  depositor: string;
  url: string;
  /** Publication: the DOIs reserved for the version and for the dataset (registered with DataCite just after). */
  dois?: { version: string; concept: string } | null;
}): EmailContent {
  const greeting = `Dear ${d.depositor},`;
  const quote = d.comment ? { label: d.kind === "request_changes" ? "The curator's comments" : d.kind === "publish" ? "The curator's note" : "Reason", text: d.comment } : undefined;
  switch (d.kind) {
    case "publish":
      return reviewEmail({
        subject: `Published: ${d.accession} ${d.title}`,
        greeting,
        paragraphs: [
          `“${d.title}” version ${d.versionNumber} is published as ${d.accession}. Its networks are queued for the metrics pipeline; the figures appear on the dataset page when computed.`,
          ...(d.dois
            ? [
                `DOI of this version: ${d.dois.version} (${doiUrl(d.dois.version)}); DOI of the dataset, always resolving to its latest version: ${d.dois.concept}. They are being registered with DataCite and resolve within minutes. Cite the version DOI in your data availability statement.`,
              ]
            : []),
        ],
        quote,
        action: { label: "Open the dataset page", url: d.url },
      });
    case "request_changes":
      return reviewEmail({
        subject: `Changes requested: ${d.title}`,
        greeting,
        paragraphs: [`A curator asks for changes to “${d.title}” (version ${d.versionNumber}) before it can be published. Edit the deposit and submit it again.`],
        quote,
        action: { label: "Answer the change request", url: d.url },
      });
    case "decline":
      return reviewEmail({
        subject: `Not accepted: ${d.title}`,
        greeting,
        paragraphs: [`A curator declined “${d.title}” (version ${d.versionNumber}).`],
        quote,
        action: { label: "Open My deposits", url: d.url },
      });
    case "withdraw":
      return reviewEmail({
        subject: `Withdrawn: ${d.accession} ${d.title}`,
        greeting,
        paragraphs: [`${d.accession} “${d.title}” was withdrawn by a curator. Its data left the catalogue and downloads; the accession and citation stay on a tombstone page.`],
        quote,
        action: { label: "Open the tombstone page", url: d.url },
      });
  }
}
