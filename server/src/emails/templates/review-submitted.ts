/** To every curator: a version was submitted and waits in the Review queue. */
import type { EmailContent } from "../mailer";
import { reviewEmail } from "./review-layout";

export function reviewSubmittedEmail(d: { title: string; depositor: string; versionNumber: number; networkCount: number; resubmission: boolean; reviewUrl: string; reply?: string | null }): EmailContent {
  return reviewEmail({
    subject: `${d.resubmission ? "Resubmitted" : "New submission"} for review: ${d.title}`,
    greeting: "Hello,",
    paragraphs: [
      `${d.depositor} ${d.resubmission ? "resubmitted" : "submitted"} “${d.title}” (version ${d.versionNumber}, ${d.networkCount} network${d.networkCount === 1 ? "" : "s"}) for review.`,
      "Any curator other than the depositor may review it.",
    ],
    quote: d.reply ? { label: "The depositor's reply", text: d.reply } : undefined,
    action: { label: "Open the review page", url: d.reviewUrl },
  });
}
