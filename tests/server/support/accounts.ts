/**
 * Test helpers for accounts: create users straight in the database and sign in through the API with a
 * supertest agent that keeps the session cookie and the CSRF token.
 */
import request from "supertest";
import type { Express } from "express";
import { User } from "../../../server/src/models";
import { hashPassword } from "../../../server/src/lib/passwords";
import type { Role } from "../../../server/src/models/user.model";

export const TEST_PASSWORD = "moss-and-lichen-42";

let counter = 0;
export async function createUser(opts: { role?: Role; email?: string; verified?: boolean; password?: string; displayName?: string } = {}): Promise<User> {
  counter++;
  return User.create({
    email: opts.email ?? `person${counter}-${Date.now()}@example.test`,
    displayName: opts.displayName ?? `Test Person ${counter}`,
    passwordHash: await hashPassword(opts.password ?? TEST_PASSWORD),
    role: opts.role ?? "depositor",
    emailVerifiedAt: opts.verified === false ? null : new Date(),
  });
}

export interface SignedInAgent {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
}

/** A fresh agent; signed in as `email` when given. */
export async function agentFor(app: Express, email?: string, password = TEST_PASSWORD): Promise<SignedInAgent> {
  const agent = request.agent(app);
  const s = await agent.get("/api/v1/auth/session");
  let csrf = s.body.csrfToken as string;
  if (email) {
    const res = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email, password });
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
    csrf = res.body.csrfToken;
  }
  return { agent, csrf };
}
