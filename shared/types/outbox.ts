/** Mail caught by the local mail catcher, as the admin's Outbox lists it (GET /api/v1/outbox). */
export interface OutboxSummary {
  id: number;
  receivedAt: string;
  to: string[];
  subject: string;
  /** The links in the message (confirmation and reset links among them). */
  links: string[];
}

/** One caught message in full (GET /api/v1/outbox/:id). */
export interface OutboxMessage extends OutboxSummary {
  from: string;
  text: string;
  html: string;
}
