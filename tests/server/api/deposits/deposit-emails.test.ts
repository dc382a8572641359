/**
 * E-mails a depositor expects, read from the real mail catcher: a receipt on submission, and one message
 * when the figures of the published version are ready (or some failed, with what happens next).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mailSettled } from "../../../../server/src/emails/mailer";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { resetRateLimits } from "../../../../server/src/middlewares/rate-limit";
import { sequelize } from "../../../../server/src/db/sequelize";
import { notifyFiguresIfDone } from "../../../../server/src/pipeline/figures-mail";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../../setup/db";
import { agentFor, createUser, type SignedInAgent } from "../../support/accounts";
import { decide, makeDraft, submit } from "../../support/deposit-helpers";
import { startMailCatcher } from "../../support/stack";

let catcher: MailCatcher;
let owner: SignedInAgent;
let curator: SignedInAgent;
let ownerEmail = "";
const M = "plant,bee A,bee B\nHeather,1,0\nGorse,2,1\n";

beforeAll(async () => {
  await resetDatabase();
  await resetRateLimits();
  catcher = await startMailCatcher();
  const app = createApp();
  const o = await createUser({ displayName: "Rowan Hale" });
  ownerEmail = o.email;
  owner = await agentFor(app, o.email);
  curator = await agentFor(app, (await createUser({ role: "curator" })).email);
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

describe("depositor e-mails", () => {
  it("a receipt on submission, with what happens next and a link to the deposit", async () => {
    const { versionId } = await makeDraft(owner, [["a.csv", M], ["b.csv", M]]);
    expect((await submit(owner, versionId)).status).toBe(200);
    const mail = await catcher.waitFor((m) => m.subject.startsWith("Received for review") && m.to.includes(ownerEmail));
    expect(mail.subject).toBe("Received for review: Flower visitors of the Verrin Hills heath");
    expect(mail.text).toContain("(version 1, 2 networks)");
    expect(mail.text).toContain("A curator will review it.");
    expect(mail.text).toContain(`/deposit/${versionId}`);
  });

  it("one message when every network's figures are done; it says which failed and what happens next", async () => {
    const { versionId } = await makeDraft(owner, [["a.csv", M], ["b.csv", M]]);
    await submit(owner, versionId);
    const pub = await decide(curator, versionId, { decision: "publish" });
    expect(pub.status).toBe(200);
    const accession = pub.body.accession as string;
    const [runs] = (await sequelize().query(
      `SELECT r.id FROM metric_runs r JOIN networks n ON n.id = r.network_id WHERE n.version_id = :v ORDER BY n.position`,
      { replacements: { v: versionId } },
    )) as [Array<{ id: number }>, unknown];
    expect(runs).toHaveLength(2);
    const before = catcher.messages.length;
    // The first network done, the second still waiting: no message yet.
    await sequelize().query(`UPDATE metric_runs SET status = 'succeeded', finished_at = now() WHERE id = :id`, { replacements: { id: runs[0].id } });
    await notifyFiguresIfDone(runs[0].id);
    // The second fails: now the message goes, once.
    await sequelize().query(`UPDATE metric_runs SET status = 'failed', error = 'test failure', finished_at = now() WHERE id = :id`, { replacements: { id: runs[1].id } });
    await notifyFiguresIfDone(runs[1].id);
    await notifyFiguresIfDone(runs[1].id);
    const mail = await catcher.waitFor((m) => m.subject.startsWith("Figures partly computed") && m.to.includes(ownerEmail));
    expect(mail.subject).toBe(`Figures partly computed: ${accession} Flower visitors of the Verrin Hills heath`);
    expect(mail.text).toContain("1 of 2 networks have their figures, and 1 could not be computed");
    expect(mail.text).toContain("What happens next");
    expect(mail.text).toContain(`/datasets/${accession}/v/1`);
    await mailSettled();
    const figureMails = catcher.messages.slice(before).filter((m) => m.subject.startsWith("Figures"));
    expect(figureMails).toHaveLength(1);
  });
});
