/**
 * The conversation on a submission between its depositor and the curators, against the real database and
 * SMTP catcher: who may read and write it, when it opens, the e-mails to the other side with working links,
 * the depositor's reply sent with a resubmission, and the thread shown identically to both sides.
 */
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AuditLog, SubmissionComment } from "../../../../server/src/models";
import { mailSettled } from "../../../../server/src/emails/mailer";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import type { ThreadEntry, ThreadResponse } from "@shared/types/review";
import type { SignedInAgent } from "../../support/accounts";
import { CURATION_URL as PUBLIC_URL, startCuration, type Curation } from "../../support/curation";
import { decide, makeDraft, submit } from "../../support/deposit-helpers";

const TITLE = "Flower visitors of the Verrin Hills heath";
let curation: Curation;
let app: Curation["app"];
let catcher: MailCatcher;
let owner: SignedInAgent;
let other: SignedInAgent;
let curatorA: SignedInAgent;
let curatorB: SignedInAgent;
let visitor: SignedInAgent;
let email: Record<"owner" | "other" | "a" | "b", string>;

async function post(who: SignedInAgent, versionId: number, body: unknown) {
  return who.agent.post(`/api/v1/deposits/${versionId}/comments`).set("x-csrf-token", who.csrf).send({ body });
}
async function thread(who: SignedInAgent, versionId: number): Promise<ThreadResponse> {
  const r = await who.agent.get(`/api/v1/deposits/${versionId}/comments`);
  expect(r.status).toBe(200);
  return r.body as ThreadResponse;
}
const brief = (e: ThreadEntry) => (e.kind === "comment" ? `${e.kind}:${e.side}:${e.author}:${e.body}` : e.kind === "decision" ? `decision:${e.decision}:${e.author}` : `submitted:${e.round}:${e.author}`);
const mailsTo = (addr: string, since: number) => catcher.messages.slice(since).filter((m) => m.to.includes(addr));
const settle = () => mailSettled();

beforeAll(async () => {
  curation = await startCuration();
  ({ app, catcher } = curation);
  ({ owner, other, curatorA, curatorB, visitor } = curation.agents);
  const { users } = curation;
  email = { owner: users.owner.email, other: users.other.email, a: users.curatorA.email, b: users.curatorB.email };
});
afterAll(() => curation.stop());

describe("a submission's thread", () => {
  let id = 0;

  it("is closed on a draft: nobody but the depositor sees it yet", async () => {
    id = (await makeDraft(owner)).versionId;
    const r = await post(owner, id, "Is the licence right?");
    expect(r.status).toBe(409);
    expect(r.body.message).toMatch(/opens once the deposit is submitted/);
    expect(await thread(owner, id)).toEqual({ entries: [], canComment: false, side: "depositor" });
  });

  it("a curator's comment is stored, shown to both sides and e-mailed to the depositor with a link to the deposit", async () => {
    expect((await submit(owner, id)).status).toBe(200);
    const before = catcher.messages.length;
    const r = await post(curatorA, id, "  Were the watches 15 or 20 minutes long?\nThe protocol says both.  ");
    expect(r.status).toBe(201);
    expect(r.body.side).toBe("curator");
    expect(r.body.entries.map(brief)).toEqual(["submitted:1:Rowan Hale", "comment:curator:Tomas Brand:Were the watches 15 or 20 minutes long?\nThe protocol says both."]);
    expect(r.body.entries[1]).toMatchObject({ own: true, round: 1 });
    const mail = await catcher.waitFor((m) => m.to.includes(email.owner) && m.subject === `New comment: ${TITLE}`);
    expect(mail.text).toContain("Tomas Brand (curator) wrote about");
    expect(mail.text).toContain("> Were the watches 15 or 20 minutes long?\n> The protocol says both.");
    expect(mail.links).toContain(`${PUBLIC_URL}/deposit/${id}`);
    await settle();
    // nobody else: curator B has not taken part
    expect(mailsTo(email.b, before)).toHaveLength(0);
    const mine = await thread(owner, id);
    expect(mine.side).toBe("depositor");
    expect(mine.canComment).toBe(true);
    expect(mine.entries.map(brief)).toEqual(r.body.entries.map(brief));
    expect(mine.entries[1]).toMatchObject({ own: false });
    const audit = await AuditLog.findOne({ where: { action: "submission.comment", entityId: String(id) } });
    expect(audit?.details).toMatchObject({ side: "curator", round: 1 });
  });

  it("the depositor's answer goes to the curators who took part, with a link to the review page", async () => {
    const before = catcher.messages.length;
    const r = await post(owner, id, "Fifteen minutes; the 20 was a typo. <b>Sorry</b>");
    expect(r.status).toBe(201);
    const mail = await catcher.waitFor((m) => m.to.includes(email.a) && m.subject === `New comment: ${TITLE}`);
    expect(mail.text).toContain("Rowan Hale (the depositor) wrote about");
    expect(mail.links).toContain(`${PUBLIC_URL}/review/${id}`);
    // the HTML part escapes what people type
    expect(mail.html).toContain("&lt;b&gt;Sorry&lt;/b&gt;");
    expect(mail.html).not.toContain("<b>Sorry</b>");
    await settle();
    expect(mailsTo(email.b, before)).toHaveLength(0);
    expect(mailsTo(email.owner, before)).toHaveLength(0);
  });

  it("decisions appear in the thread; a resubmission carries the depositor's reply, quoted in the curators' e-mail", async () => {
    expect((await decide(curatorB, id, { decision: "request_changes", comment: "Please state the watch length in the protocol." })).status).toBe(200);
    const before = catcher.messages.length;
    const re = await owner.agent.post(`/api/v1/deposits/${id}/submit`).set("x-csrf-token", owner.csrf).send({ reply: "The protocol now says 15-minute watches." });
    expect(re.status).toBe(200);
    const mail = await catcher.waitFor((m) => m.to.includes(email.b) && m.subject.startsWith("Resubmitted for review"));
    expect(mail.text).toContain("The depositor's reply:\n> The protocol now says 15-minute watches.");
    await settle();
    // one e-mail per curator for the resubmission, none for the reply on its own
    expect(mailsTo(email.a, before).map((m) => m.subject)).toEqual([`Resubmitted for review: ${TITLE}`]);
    const t = await thread(curatorA, id);
    expect(t.entries.map(brief)).toEqual([
      "submitted:1:Rowan Hale",
      "comment:curator:Tomas Brand:Were the watches 15 or 20 minutes long?\nThe protocol says both.",
      "comment:depositor:Rowan Hale:Fifteen minutes; the 20 was a typo. <b>Sorry</b>",
      "decision:request_changes:Maren Ilves",
      "submitted:2:Rowan Hale",
      "comment:depositor:Rowan Hale:The protocol now says 15-minute watches.",
    ]);
    expect(t.entries[3]).toMatchObject({ body: "Please state the watch length in the protocol." });
    expect(t.entries[5]).toMatchObject({ round: 2 });
    // a reply must be text within the limit; nothing is submitted otherwise
    const bad = await owner.agent.post(`/api/v1/deposits/${id}/submit`).set("x-csrf-token", owner.csrf).send({ reply: 42 });
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: "/reply", message: "reply must be text of at most 10000 characters (or null)." }]);
  });

  it("after the decision the conversation goes on (a published submission), now to both curators who took part", async () => {
    expect((await decide(curatorA, id, { decision: "publish" })).status).toBe(200);
    const before = catcher.messages.length;
    expect((await post(owner, id, "Thank you both.")).status).toBe(201);
    await catcher.waitFor((m) => m.to.includes(email.a) && m.text.includes("Thank you both."));
    await catcher.waitFor((m) => m.to.includes(email.b) && m.text.includes("Thank you both."));
    await settle();
    expect(catcher.messages.slice(before).filter((m) => m.text.includes("Thank you both.")).map((m) => m.to).flat().sort()).toEqual([email.a, email.b].sort());
  });

  it("only the owner and curators: others 404, visitors 401; the text is checked", async () => {
    expect((await other.agent.get(`/api/v1/deposits/${id}/comments`)).status).toBe(404);
    expect((await post(other, id, "Hello")).status).toBe(404);
    expect((await visitor.agent.get(`/api/v1/deposits/${id}/comments`)).status).toBe(401);
    expect((await visitor.agent.post(`/api/v1/deposits/${id}/comments`).set("x-csrf-token", visitor.csrf).send({ body: "Hello" })).status).toBe(401);
    expect((await curatorA.agent.get(`/api/v1/deposits/999999/comments`)).status).toBe(404);
    const empty = await post(owner, id, "   \n ");
    expect(empty.status).toBe(422);
    expect(empty.body.details).toEqual([{ path: "/body", message: "body must be text of 1 to 10000 characters, not only spaces." }]);
    const notText = await post(owner, id, { text: "x" });
    expect(notText.status).toBe(422);
    expect(notText.body.details).toEqual([{ path: "/body", message: "body must be text of 1 to 10000 characters, not only spaces." }]);
    const long = await post(owner, id, "x".repeat(10_001));
    expect(long.status).toBe(422);
    expect(long.body.details[0]).toEqual({ path: "/body", message: "body must be text of 1 to 10000 characters, not only spaces." });
    expect(await SubmissionComment.count({ where: { body: "Hello" } })).toBe(0);
  });

  it("a depositor may comment with an API token; a curator needs a browser session", async () => {
    const tokenOf = async (who: SignedInAgent) => (await who.agent.post("/api/v1/tokens").set("x-csrf-token", who.csrf).send({ name: "script" })).body.secret as string;
    const ownerToken = await tokenOf(owner);
    const curatorToken = await tokenOf(curatorA);
    const byOwner = await request(app).post(`/api/v1/deposits/${id}/comments`).set("authorization", `Bearer ${ownerToken}`).send({ body: "Sent from my script." });
    expect(byOwner.status).toBe(201);
    const byCurator = await request(app).post(`/api/v1/deposits/${id}/comments`).set("authorization", `Bearer ${curatorToken}`).send({ body: "From a script." });
    expect(byCurator.status).toBe(403);
    expect(byCurator.body.code).toBe("session_required");
    expect((await request(app).get(`/api/v1/deposits/${id}/comments`).set("authorization", `Bearer ${curatorToken}`)).status).toBe(200);
  });
});

describe("a first comment from the depositor", () => {
  it("goes to every curator when none has taken part yet", async () => {
    const { versionId } = await makeDraft(owner);
    expect((await submit(owner, versionId)).status).toBe(200);
    expect((await post(owner, versionId, "The second file is the 2020 season.")).status).toBe(201);
    await catcher.waitFor((m) => m.to.includes(email.a) && m.text.includes("The second file is the 2020 season."));
    await catcher.waitFor((m) => m.to.includes(email.b) && m.text.includes("The second file is the 2020 season."));
  });
});
