/**
 * A running Tanglebank for tests: the real app on an ephemeral port, a real SMTP mail catcher, the test
 * database. Mails sent by the app land in `catcher.messages`; links in them point at `url`.
 */
import type { Express } from "express";
import { MailCatcher, setCurrentMailCatcher } from "../../../server/src/lib/mail-catcher";
import { resetConfig } from "../../../server/src/config/env";
import { resetMailer } from "../../../server/src/emails/mailer";
import { shutdownServerResources, startServer } from "../../../server/src/index";

export interface TestStack {
  url: string;
  app: Express;
  catcher: MailCatcher;
  stop: () => Promise<void>;
}

export async function startMailCatcher(): Promise<MailCatcher> {
  const catcher = new MailCatcher();
  const port = await catcher.listen(0);
  process.env.SMTP_HOST = "127.0.0.1";
  process.env.SMTP_PORT = String(port);
  resetConfig();
  resetMailer();
  setCurrentMailCatcher(catcher);
  return catcher;
}

/** Starts catcher + HTTP server on 127.0.0.1 with an ephemeral port; PUBLIC_URL points at it. */
export async function startStack(): Promise<TestStack> {
  const catcher = await startMailCatcher();
  const { server, url, close } = await startServer(0, "127.0.0.1");
  process.env.PUBLIC_URL = url;
  resetConfig();
  const app = server.listeners("request")[0] as Express;
  return {
    url,
    app,
    catcher,
    stop: async () => {
      await close();
      await catcher.close();
      setCurrentMailCatcher(undefined);
      await shutdownServerResources();
    },
  };
}
