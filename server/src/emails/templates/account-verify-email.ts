import { accountEmail } from "./account-layout";
import type { EmailContent } from "../mailer";

/** Sent at sign-up and on request: a one-time link that confirms the address. */
export function accountVerifyEmail(data: { displayName: string; url: string; validHours: number }): EmailContent {
  return accountEmail({
    subject: "Confirm your e-mail address for Tanglebank",
    greeting: `Hello ${data.displayName},`,
    paragraphs: [
      "Thank you for creating a Tanglebank account. Please confirm that this e-mail address is yours; you need a confirmed address to deposit networks.",
      `The link works once and for ${data.validHours} hours.`,
    ],
    action: { label: "Confirm my e-mail address", url: data.url },
    footer: "If you did not create an account, ignore this message; nothing happens without the link.",
  });
}
