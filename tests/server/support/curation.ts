/**
 * The setting of the curation tests: the app in-process (supertest) on a fresh database with a real SMTP
 * catcher, links in mails pointing at CURATION_URL, and its people signed in: the depositor Rowan Hale,
 * another depositor (Ilse Marrow), two curators (Tomas Brand, Maren Ilves), an admin and a visitor.
 */
import { createApp } from "../../../server/src/app";
import { shutdownServerResources } from "../../../server/src/index";
import { resetRateLimits } from "../../../server/src/middlewares/rate-limit";
import type { MailCatcher } from "../../../server/src/lib/mail-catcher";
import type { User } from "../../../server/src/models";
import { resetDatabase } from "../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "./accounts";
import { startMailCatcher } from "./stack";

export const CURATION_URL = "http://tanglebank.test:3000";

type Person = "owner" | "other" | "curatorA" | "curatorB" | "admin";

export interface Curation {
  app: ReturnType<typeof createApp>;
  catcher: MailCatcher;
  /** Each person's account. */
  users: Record<Person, User>;
  /** Each person signed in, and a visitor who is not. */
  agents: Record<Person | "visitor", SignedInAgent>;
  stop: () => Promise<void>;
}

export async function startCuration(): Promise<Curation> {
  process.env.PUBLIC_URL = CURATION_URL;
  await resetDatabase();
  await resetRateLimits();
  const catcher = await startMailCatcher();
  const app = createApp();
  const users = {
    owner: await createUser({ displayName: "Rowan Hale" }),
    other: await createUser({ displayName: "Ilse Marrow" }),
    curatorA: await createUser({ role: "curator", displayName: "Tomas Brand" }),
    curatorB: await createUser({ role: "curator", displayName: "Maren Ilves" }),
    admin: await createUser({ role: "admin" }),
  };
  const agents = { visitor: await agentFor(app) } as Curation["agents"];
  for (const p of Object.keys(users) as Person[]) agents[p] = await agentFor(app, users[p].email);
  return {
    app,
    catcher,
    users,
    agents,
    stop: async () => {
      delete process.env.PUBLIC_URL;
      await catcher.close();
      await shutdownServerResources();
    },
  };
}
