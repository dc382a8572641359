import request from "supertest";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { mailSettled } from "../../../../server/src/emails/mailer";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { sequelize } from "../../../../server/src/db/sequelize";
import { AuditLog, User, UserToken } from "../../../../server/src/models";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { hashLinkToken } from "../../../../server/src/api/auth/auth.service";
import { verifyPassword } from "../../../../server/src/lib/passwords";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../../setup/db";
import { startMailCatcher } from "../../support/stack";
import { agentFor, createUser, TEST_PASSWORD } from "../../support/accounts";

let catcher: MailCatcher;
let app: ReturnType<typeof createApp>;

beforeAll(async () => {
  await resetDatabase();
  catcher = await startMailCatcher();
  app = createApp();
});
beforeEach(resetRateLimits);
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

function tokenFrom(link: string): string {
  return new URL(link).searchParams.get("token")!;
}

function sidCookie(res: request.Response): string | undefined {
  const raw = res.headers["set-cookie"] as unknown as string[] | undefined;
  return raw?.find((c) => c.startsWith("tb.sid="))?.split(";")[0];
}

describe("sign-up → e-mail → verify → sign-in → sign-out", () => {
  it("runs the whole flow against the database and the mail catcher", async () => {
    const { agent, csrf } = await agentFor(app);
    const email = "Wren.Talbot@Example.TEST";
    const up = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email, displayName: "  Wren   Talbot ", password: "sedge-meadow-1987" });
    expect(up.status).toBe(201);
    expect(up.body.user).toMatchObject({ email: "wren.talbot@example.test", displayName: "Wren Talbot", role: "depositor", emailVerified: false });

    const row = await User.findOne({ where: { email: "wren.talbot@example.test" } });
    expect(row).not.toBeNull();
    expect(row!.passwordHash).toMatch(/^scrypt\$/);
    expect(row!.passwordHash).not.toContain("sedge-meadow-1987");

    // Sign-up does not sign in.
    const after = await agent.get("/api/v1/auth/session");
    expect(after.body.user).toBeNull();

    const mail = await catcher.waitFor((m) => m.to.includes("wren.talbot@example.test") && /confirm/i.test(m.subject));
    const link = mail.links.find((l) => l.includes("/verify-email?token="));
    expect(link).toBeDefined();
    const token = tokenFrom(link!);
    // Only the SHA-256 of the token is stored.
    const stored = await UserToken.findAll({ where: { userId: row!.id, purpose: "verify-email" } });
    expect(stored).toHaveLength(1);
    expect(stored[0].tokenHash).toBe(hashLinkToken(token));
    expect(stored[0].tokenHash).not.toContain(token);
    const hoursValid = (stored[0].expiresAt.getTime() - Date.now()) / 3600e3;
    expect(hoursValid).toBeGreaterThan(47);
    expect(hoursValid).toBeLessThanOrEqual(48);

    // Unverified accounts may sign in but are flagged.
    const early = await agentFor(app, "wren.talbot@example.test", "sedge-meadow-1987");
    const earlySession = await early.agent.get("/api/v1/auth/session");
    expect(earlySession.body.user.emailVerified).toBe(false);

    const verify = await agent.post("/api/v1/auth/verify-email").set("x-csrf-token", csrf).send({ token });
    expect(verify.status).toBe(200);
    expect((await User.findByPk(row!.id))!.emailVerifiedAt).not.toBeNull();
    expect(await AuditLog.count({ where: { action: "user.email_verified", entityId: String(row!.id) } })).toBe(1);
    // The earlier session sees the change at once.
    expect((await early.agent.get("/api/v1/auth/session")).body.user.emailVerified).toBe(true);

    const reuse = await agent.post("/api/v1/auth/verify-email").set("x-csrf-token", csrf).send({ token });
    expect(reuse.status).toBe(410);
    expect(reuse.body.code).toBe("link_used");

    const before = await agent.get("/api/v1/auth/session");
    const sidBefore = sidCookie(before) ?? sidCookie(up);
    const signIn = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: "WREN.talbot@example.test", password: "sedge-meadow-1987" });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user).toMatchObject({ email: "wren.talbot@example.test", emailVerified: true });
    const sidAfter = sidCookie(signIn);
    expect(sidAfter).toBeDefined();
    expect(sidAfter).not.toBe(sidBefore);
    expect(signIn.body.csrfToken).toMatch(/^[A-Za-z0-9_-]{20,}$/);
    expect(signIn.body.csrfToken).not.toBe(csrf);

    // The old CSRF token belonged to the old session.
    const stale = await agent.post("/api/v1/auth/sign-out").set("x-csrf-token", csrf).send({});
    expect(stale.status).toBe(403);

    const session = await agent.get("/api/v1/auth/session");
    expect(session.body.user.email).toBe("wren.talbot@example.test");
    const out = await agent.post("/api/v1/auth/sign-out").set("x-csrf-token", signIn.body.csrfToken).send({});
    expect(out.status).toBe(204);
    const gone = await agent.get("/api/v1/auth/session");
    expect(gone.body.user).toBeNull();
    const [rows] = await sequelize().query(`SELECT count(*)::int AS n FROM session WHERE (sess->>'userId') = '${row!.id}'`);
    // Only the "early" agent's session remains.
    expect((rows as Array<{ n: number }>)[0].n).toBe(1);
  });

  it("changes the session id at sign-in even for a visitor who already had a session", async () => {
    const u = await createUser();
    const agent = request.agent(app);
    const first = await agent.get("/api/v1/auth/session");
    const sid1 = sidCookie(first);
    expect(sid1).toBeDefined();
    const res = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", first.body.csrfToken).send({ email: u.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const sid2 = sidCookie(res);
    expect(sid2).toBeDefined();
    expect(sid2).not.toBe(sid1);
    const [rows] = await sequelize().query(`SELECT sid FROM session WHERE sid = :sid`, { replacements: { sid: decodeURIComponent(sid1!.slice(7)).replace(/^s:/, "").split(".")[0] } });
    expect(rows).toHaveLength(0);
  });

  it("resends a confirmation link, and answers the same whether or not the account exists", async () => {
    const u = await createUser({ verified: false });
    const { agent, csrf } = await agentFor(app);
    const known = await agent.post("/api/v1/auth/verification-email").set("x-csrf-token", csrf).send({ email: u.email });
    const unknown = await agent.post("/api/v1/auth/verification-email").set("x-csrf-token", csrf).send({ email: "nobody-here@example.test" });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    const mail = await catcher.waitFor((m) => m.to.includes(u.email));
    expect(mail.links.some((l) => l.includes("/verify-email?token="))).toBe(true);
  });
});

describe("sign-up and sign-in errors", () => {
  it("refuses a duplicate e-mail (any letter case) with 409", async () => {
    const u = await createUser({ email: "dup.check@example.test" });
    const { agent, csrf } = await agentFor(app);
    const res = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email: "DUP.Check@example.test", displayName: "Someone", password: "long-enough-pass-1" });
    expect(res.status).toBe(409);
    expect(res.body.code).toBe("conflict");
    expect(res.body.message).toMatch(/already exists/);
    expect(res.body.details).toEqual([{ path: "/email", message: expect.stringMatching(/already exists/) }]);
    expect(await User.count({ where: { email: u.email } })).toBe(1);
  });

  it("refuses a weak password with 422 naming the rule", async () => {
    const { agent, csrf } = await agentFor(app);
    const short = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email: "weak1@example.test", displayName: "W", password: "short1" });
    expect(short.status).toBe(422);
    expect(short.body.message).toBe("Password must be at least 10 characters long.");
    expect(short.body.details).toEqual([{ path: "/password", message: "Password must be at least 10 characters long.", rule: "password_policy" }]);
    const noDigit = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email: "weak2@example.test", displayName: "W", password: "onlylettershere" });
    expect(noDigit.status).toBe(422);
    expect(noDigit.body.message).toMatch(/one letter and one digit/);
    expect(await User.count({ where: { email: ["weak1@example.test", "weak2@example.test"] } })).toBe(0);
  });

  it("refuses a malformed e-mail and a missing name with 422 and one detail per field", async () => {
    const { agent, csrf } = await agentFor(app);
    const res = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).send({ email: "not-an-address", displayName: "", password: "long-enough-pass-1" });
    expect(res.status).toBe(422);
    expect(res.body.details).toEqual([
      { path: "/email", message: "This is not a valid e-mail address (expected name@example.org)." },
      { path: "/displayName", message: "Name is required." },
    ]);
  });

  it("answers malformed JSON with 400", async () => {
    const { agent, csrf } = await agentFor(app);
    const res = await agent.post("/api/v1/auth/sign-up").set("x-csrf-token", csrf).set("content-type", "application/json").send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.code).toBe("malformed_json");
  });

  it("answers a wrong password and an unknown e-mail with the same 401", async () => {
    const u = await createUser();
    const { agent, csrf } = await agentFor(app);
    const wrong = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: u.email, password: "not-the-password-9" });
    const unknown = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: "no-such@example.test", password: "not-the-password-9" });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.message).not.toMatch(/unknown|no account|wrong password/i);
    expect((await agent.get("/api/v1/auth/session")).body.user).toBeNull();
  });
});

describe("password reset", () => {
  async function requestReset(email: string) {
    const { agent, csrf } = await agentFor(app);
    const res = await agent.post("/api/v1/auth/password-reset").set("x-csrf-token", csrf).send({ email });
    return { res, agent, csrf };
  }

  it("always answers 202, sends a one-hour link only to existing accounts, and the link works once", async () => {
    const u = await createUser({ verified: false });
    const other = await agentFor(app, u.email);
    const sent = catcher.messages.length;
    const { res, agent, csrf } = await requestReset(u.email);
    const none = await requestReset("absent@example.test");
    expect(res.status).toBe(202);
    expect(none.res.status).toBe(202);
    expect(none.res.body).toEqual(res.body);

    const mail = await catcher.waitFor((m) => m.to.includes(u.email) && /reset/i.test(m.subject));
    await mailSettled();
    expect(catcher.messages.slice(sent).filter((m) => m.to.includes("absent@example.test"))).toHaveLength(0);
    const token = tokenFrom(mail.links.find((l) => l.includes("/reset-password?token="))!);
    const row = await UserToken.findOne({ where: { tokenHash: hashLinkToken(token) } });
    const minutes = (row!.expiresAt.getTime() - Date.now()) / 60e3;
    expect(minutes).toBeGreaterThan(58);
    expect(minutes).toBeLessThanOrEqual(60);

    const weak = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token, password: "short" });
    expect(weak.status).toBe(422);

    const made = await other.agent.post("/api/v1/tokens").set("x-csrf-token", other.csrf).send({ name: "script" });
    expect(made.status).toBe(201);
    const bearer = { Authorization: `Bearer ${made.body.secret as string}` };
    expect((await request(app).get("/api/v1/account").set(bearer)).status).toBe(200);
    const ok = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token, password: "new-heathland-pass-7" });
    expect(ok.status).toBe(200);
    // The account's API tokens are revoked too, and the answer says so.
    expect(ok.body.revokedTokens).toBe(1);
    expect(ok.body.message).toMatch(/personal API token was revoked/);
    expect((await request(app).get("/api/v1/account").set(bearer)).status).toBe(401);
    const fresh = await User.findByPk(u.id);
    expect(await verifyPassword("new-heathland-pass-7", fresh!.passwordHash)).toBe(true);
    expect(fresh!.emailVerifiedAt).not.toBeNull();
    // Every session of the account ended.
    expect((await other.agent.get("/api/v1/auth/session")).body.user).toBeNull();

    const again = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token, password: "another-pass-word-8" });
    expect(again.status).toBe(410);
    expect(again.body.code).toBe("link_used");

    const oldPw = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: u.email, password: TEST_PASSWORD });
    expect(oldPw.status).toBe(401);
    const newPw = await agent.post("/api/v1/auth/sign-in").set("x-csrf-token", csrf).send({ email: u.email, password: "new-heathland-pass-7" });
    expect(newPw.status).toBe(200);
  });

  it("using one reset link invalidates the account's other reset links", async () => {
    const u = await createUser();
    await requestReset(u.email);
    await requestReset(u.email);
    await catcher.waitFor((m) => m.to.includes(u.email) && catcher.messages.filter((x) => x.to.includes(u.email)).length >= 2);
    const links = catcher.messages.filter((m) => m.to.includes(u.email)).map((m) => tokenFrom(m.links.find((l) => l.includes("reset-password"))!));
    expect(new Set(links).size).toBe(2);
    const { agent, csrf } = await agentFor(app);
    expect((await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token: links[1], password: "first-new-pass-11" })).status).toBe(200);
    const second = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token: links[0], password: "second-new-pass-12" });
    expect(second.status).toBe(410);
    expect(second.body.code).toBe("link_used");
  });

  it("refuses an expired link with 410 link_expired and an unknown one with 400 link_invalid", async () => {
    const u = await createUser();
    await requestReset(u.email);
    const mail = await catcher.waitFor((m) => m.to.includes(u.email));
    const token = tokenFrom(mail.links.find((l) => l.includes("reset-password"))!);
    await UserToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashLinkToken(token) } });
    const { agent, csrf } = await agentFor(app);
    const expired = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token, password: "fine-password-13" });
    expect(expired.status).toBe(410);
    expect(expired.body.code).toBe("link_expired");
    expect(await verifyPassword(TEST_PASSWORD, (await User.findByPk(u.id))!.passwordHash)).toBe(true);

    const bogus = await agent.post("/api/v1/auth/password-reset/confirm").set("x-csrf-token", csrf).send({ token: "A".repeat(43), password: "fine-password-13" });
    expect(bogus.status).toBe(400);
    expect(bogus.body.code).toBe("link_invalid");
    const missing = await agent.post("/api/v1/auth/verify-email").set("x-csrf-token", csrf).send({});
    expect(missing.status).toBe(400);
    expect(missing.body.code).toBe("link_invalid");
  });
});

describe("account profile and password", () => {
  it("updates the profile, validates ORCID iDs, and changes the password keeping this session only", async () => {
    const u = await createUser();
    const me = await agentFor(app, u.email);
    const elsewhere = await agentFor(app, u.email);
    const get = await me.agent.get("/api/v1/account");
    expect(get.status).toBe(200);
    expect(get.body).toMatchObject({ id: u.id, email: u.email, affiliation: null, orcid: null });

    // 0000-0002-1825-0097 is the example iD in ORCID's own documentation (from memory); its check digit is 7.
    const ok = await me.agent.patch("/api/v1/account").set("x-csrf-token", me.csrf).send({ displayName: "Juniper Ash", affiliation: "Verrin Hills Ecology Group", orcid: "https://orcid.org/0000-0002-1825-0097" });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ displayName: "Juniper Ash", orcid: "0000-0002-1825-0097" });
    expect((await User.findByPk(u.id))!.affiliation).toBe("Verrin Hills Ecology Group");

    const badCheck = await me.agent.patch("/api/v1/account").set("x-csrf-token", me.csrf).send({ orcid: "0000-0002-1825-0098" });
    expect(badCheck.status).toBe(422);
    expect(badCheck.body.details).toEqual([{ path: "/orcid", message: "This ORCID iD's check digit is wrong: check for a typing error." }]);
    const notAnId = await me.agent.patch("/api/v1/account").set("x-csrf-token", me.csrf).send({ orcid: "0000-0002-1825", displayName: " ", colour: "red" });
    expect(notAnId.status).toBe(422);
    expect(notAnId.body.details).toEqual([
      { path: "/colour", message: "colour is not a field of this request (fields: displayName, affiliation, orcid)." },
      { path: "/displayName", message: "Name is required." },
      { path: "/orcid", message: "orcid must be an ORCID iD such as 0000-0002-1825-0097 (four groups of four digits; the last may be X), or its https://orcid.org/ address; empty or null removes it." },
    ]);
    const cleared = await me.agent.patch("/api/v1/account").set("x-csrf-token", me.csrf).send({ affiliation: "  ", orcid: "" });
    expect(cleared.body).toMatchObject({ affiliation: null, orcid: null });
    const weak = await me.agent.put("/api/v1/account/password").set("x-csrf-token", me.csrf).send({ currentPassword: TEST_PASSWORD, newPassword: "short1" });
    expect(weak.status).toBe(422);
    expect(weak.body).toMatchObject({ message: "Password must be at least 10 characters long.", details: [{ path: "/newPassword", message: "Password must be at least 10 characters long.", rule: "password_policy" }] });
    const same = await me.agent.put("/api/v1/account/password").set("x-csrf-token", me.csrf).send({ currentPassword: TEST_PASSWORD, newPassword: TEST_PASSWORD });
    expect(same.body.message).toBe("The new password must differ from the current one.");

    const wrongCurrent = await me.agent.put("/api/v1/account/password").set("x-csrf-token", me.csrf).send({ currentPassword: "nope-nope-123", newPassword: "brand-new-pass-21" });
    expect(wrongCurrent.status).toBe(422);
    expect(wrongCurrent.body.details[0].path).toBe("/currentPassword");

    const changed = await me.agent.put("/api/v1/account/password").set("x-csrf-token", me.csrf).send({ currentPassword: TEST_PASSWORD, newPassword: "brand-new-pass-21" });
    expect(changed.status).toBe(204);
    expect((await me.agent.get("/api/v1/auth/session")).body.user.id).toBe(u.id);
    expect((await elsewhere.agent.get("/api/v1/auth/session")).body.user).toBeNull();
    expect(await AuditLog.count({ where: { action: "user.password_changed", entityId: String(u.id) } })).toBe(1);
  });
});
