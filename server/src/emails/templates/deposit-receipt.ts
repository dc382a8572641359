/** To the depositor: their submission arrived and waits for a curator. */
import type { EmailContent } from "../mailer";
import { reviewEmail } from "./review-layout";

export function depositReceiptEmail(d: { title: string; depositor: string; versionNumber: number; networkCount: number; resubmission: boolean; at: Date; url: string }): EmailContent {
  return reviewEmail({
    subject: `Received for review: ${d.title}`,
    greeting: `Hello ${d.depositor},`,
    paragraphs: [
      `Tanglebank received your ${d.resubmission ? "resubmission" : "submission"} of “${d.title}” (version ${d.versionNumber}, ${d.networkCount} network${d.networkCount === 1 ? "" : "s"}) on ${d.at.toISOString().slice(0, 16).replace("T", " ")} UTC.`,
      "A curator will review it. You will get an e-mail with their decision, and the deposit page shows its state meanwhile; it cannot be edited while it waits.",
    ],
    action: { label: "Open your deposit", url: d.url },
  });
}
