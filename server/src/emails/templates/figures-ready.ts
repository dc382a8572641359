/** To the depositor: every network of their published version has its figures, or some failed. */
import type { EmailContent } from "../mailer";
import { reviewEmail } from "./review-layout";

export function figuresReadyEmail(d: { title: string; depositor: string; accession: string; versionNumber: number; succeeded: number; failed: number; url: string }): EmailContent {
  const total = d.succeeded + d.failed;
  const paragraphs =
    d.failed === 0
      ? [`The metrics pipeline has computed the figures of all ${total} network${total === 1 ? "" : "s"} of ${d.accession} version ${d.versionNumber}, “${d.title}”: modularity with its partition, its significance against null models, node roles and nestedness.`, "The dataset page shows them now."]
      : [
          `The metrics pipeline finished ${d.accession} version ${d.versionNumber}, “${d.title}”: ${d.succeeded} of ${total} network${total === 1 ? "" : "s"} have their figures, and ${d.failed} could not be computed.`,
          "What happens next: the pipeline's administrators are shown every failed computation with its error and retry it once the cause is fixed; the dataset stays published, its pages show the figures that exist and say which are missing, and you need not do anything. If the data itself is at fault, a curator will write to you.",
        ];
  return reviewEmail({
    subject: d.failed === 0 ? `Figures ready: ${d.accession} ${d.title}` : `Figures partly computed: ${d.accession} ${d.title}`,
    greeting: `Hello ${d.depositor},`,
    paragraphs,
    action: { label: "Open the dataset page", url: d.url },
  });
}
