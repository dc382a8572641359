/**
 * Outgoing mail over SMTP with nodemailer. In development and tests SMTP points at the local mail catcher;
 * in production SMTP_HOST/SMTP_PORT/SMTP_USER/SMTP_PASS point at a real mail service.
 */
import nodemailer, { type Transporter } from "nodemailer";
import { config } from "../config/env";

export interface EmailContent {
  subject: string;
  text: string;
  html: string;
}

let transporter: Transporter | undefined;

function transport(): Transporter {
  if (!transporter) {
    const { smtp } = config();
    transporter = nodemailer.createTransport({
      host: smtp.host,
      port: smtp.port,
      secure: smtp.secure,
      auth: smtp.user ? { user: smtp.user, pass: smtp.pass ?? "" } : undefined,
      // The local catcher speaks plain SMTP on loopback.
      ignoreTLS: !smtp.secure && (smtp.host === "127.0.0.1" || smtp.host === "localhost"),
    });
  }
  return transporter;
}

const inFlight = new Set<Promise<unknown>>();

export async function sendMail(to: string | string[], content: EmailContent): Promise<void> {
  const sending = transport().sendMail({ from: config().smtp.from, to, subject: content.subject, text: content.text, html: content.html });
  inFlight.add(sending);
  try {
    await sending;
  } finally {
    inFlight.delete(sending);
  }
}

/**
 * Resolves once no message is being sent (successfully or not). Tests await it before asserting that a
 * message was NOT sent: the local catcher stores a message before the SMTP server acknowledges it, so
 * every message sent so far is in the catcher by then.
 */
export async function mailSettled(): Promise<void> {
  while (inFlight.size) await Promise.allSettled([...inFlight]);
}

/** Tests call this after changing SMTP settings. */
export function resetMailer(): void {
  transporter?.close();
  transporter = undefined;
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}
