import { currentMailCatcher, type CapturedMail } from "../../lib/mail-catcher";
import { ApiError } from "../../lib/api-error";
import type { OutboxSummary } from "@shared/types/outbox";


function catcher() {
  const c = currentMailCatcher();
  if (!c) {
    throw new ApiError(404, "no_mail_catcher", "No local mail catcher runs in this process: mail goes to the SMTP server configured by SMTP_HOST, so there is no outbox to show.");
  }
  return c;
}

export function listMessages(q: { to?: string }): { data: OutboxSummary[]; meta: { total: number } } {
  const needle = q.to?.trim().toLowerCase();
  const all = [...catcher().messages].reverse().filter((m) => !needle || m.to.some((t) => t.toLowerCase().includes(needle)));
  return { data: all.map((m) => ({ id: m.id, receivedAt: m.receivedAt, to: m.to, subject: m.subject, links: m.links })), meta: { total: all.length } };
}

export function getMessage(id: number): CapturedMail {
  const m = catcher().messages.find((x) => x.id === id);
  if (!m) throw ApiError.notFound(`No message ${id} in the outbox.`);
  return m;
}
