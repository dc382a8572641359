/**
 * The local mail catcher for development and tests: a real SMTP server (smtp-server) on 127.0.0.1 that
 * accepts every message, parses it (mailparser) and keeps it, so the Outbox page and tests can read the
 * mails and follow their links. Optionally appends each message to a JSON-lines file so the outbox
 * survives restarts.
 */
import { appendFileSync, existsSync, mkdirSync, readFileSync } from "node:fs";
import { dirname } from "node:path";
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import type { OutboxMessage } from "@shared/types/outbox";

/** A caught message: what the Outbox shows (shared/types/outbox.ts). */
export type CapturedMail = OutboxMessage;

export class MailCatcher {
  readonly messages: CapturedMail[] = [];
  private server: SMTPServer;
  private nextId = 1;
  private waiters: Array<() => void> = [];
  port = 0;

  constructor(private readonly storeFile?: string) {
    if (storeFile && existsSync(storeFile)) {
      for (const line of readFileSync(storeFile, "utf8").split("\n")) {
        if (!line.trim()) continue;
        try {
          const m = JSON.parse(line) as CapturedMail;
          this.messages.push(m);
          this.nextId = Math.max(this.nextId, m.id + 1);
        } catch {
          /* skip a torn last line */
        }
      }
    }
    this.server = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      onData: (stream, session, callback) => {
        simpleParser(stream)
          .then((parsed) => {
            const html = typeof parsed.html === "string" ? parsed.html : "";
            const text = parsed.text ?? "";
            const links = Array.from(new Set([...(html + "\n" + text).matchAll(/https?:\/\/[^\s"'<>]+/g)].map((m) => m[0])));
            const mail: CapturedMail = {
              id: this.nextId++,
              receivedAt: new Date().toISOString(),
              from: parsed.from?.text ?? "",
              to: session.envelope.rcptTo.map((r) => r.address),
              subject: parsed.subject ?? "",
              text,
              html,
              links,
            };
            this.messages.push(mail);
            if (this.storeFile) {
              mkdirSync(dirname(this.storeFile), { recursive: true });
              appendFileSync(this.storeFile, JSON.stringify(mail) + "\n");
            }
            const w = this.waiters;
            this.waiters = [];
            w.forEach((f) => f());
            callback();
          })
          .catch((err: Error) => callback(err));
      },
    });
  }

  listen(port: number, host = "127.0.0.1"): Promise<number> {
    return new Promise((resolve, reject) => {
      this.server.once("error", reject);
      this.server.listen(port, host, () => {
        const addr = this.server.server.address();
        this.port = typeof addr === "object" && addr ? addr.port : port;
        resolve(this.port);
      });
    });
  }

  close(): Promise<void> {
    return new Promise((resolve) => this.server.close(() => resolve()));
  }

  /** Waits until a message matching `pred` arrives (tests). */
  async waitFor(pred: (m: CapturedMail) => boolean, timeoutMs = 10_000): Promise<CapturedMail> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const found = [...this.messages].reverse().find(pred);
      if (found) return found;
      const left = deadline - Date.now();
      if (left <= 0) throw new Error("No matching mail arrived in the catcher");
      await new Promise<void>((resolve) => {
        const t = setTimeout(resolve, Math.min(left, 500));
        this.waiters.push(() => {
          clearTimeout(t);
          resolve();
        });
      });
    }
  }
}

let current: MailCatcher | undefined;
/** The catcher running in this process, if any (the Outbox reads it). */
export function currentMailCatcher(): MailCatcher | undefined {
  return current;
}
export function setCurrentMailCatcher(c: MailCatcher | undefined): void {
  current = c;
}
