/** To the other side of a submission's thread: a new comment, quoted, with a link to answer it. */
import type { EmailContent } from "../mailer";
import { reviewEmail } from "./review-layout";

export function submissionCommentEmail(d: { to: "depositor" | "curator"; recipient: string; author: string; authorSide: "depositor" | "curator"; title: string; versionNumber: number; body: string; url: string}): EmailContent {
  const who = d.authorSide === "curator" ? `${d.author} (curator)` : `${d.author} (the depositor)`;
  return reviewEmail({
    subject: `New comment: ${d.title}`,
    greeting: d.to === "depositor" ? `Dear ${d.recipient},` : "Hello,",
    paragraphs: [
      `${who} wrote about “${d.title}” (version ${d.versionNumber}).`,
      d.to === "depositor" ? "You can answer on your deposit's page; the curators see the whole conversation." : "Answer on the review page; the depositor sees the whole conversation.",
    ],
    quote: { label: d.authorSide === "curator" ? "The curator wrote" : "The depositor wrote", text: d.body },
    action: { label: d.to === "depositor" ? "Open your deposit" : "Open the review page", url: d.url },
  });
}
