import { accountEmail } from "./account-layout";
import type { EmailContent } from "../mailer";

/** Sent when someone asks to reset the password of an existing account. */
export function accountPasswordReset(data: { displayName: string; url: string; validMinutes: number }): EmailContent {
  return accountEmail({
    subject: "Reset your Tanglebank password",
    greeting: `Hello ${data.displayName},`,
    paragraphs: [
      "Someone (hopefully you) asked to reset the password of your Tanglebank account.",
      `The link works once and for ${data.validMinutes} minutes. Choosing a new password signs you out everywhere else.`,
    ],
    action: { label: "Choose a new password", url: data.url },
    footer: "If you did not ask for this, ignore this message: your password stays as it is.",
  });
}
