import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../../server/src/app";
import { shutdownServerResources } from "../../../../server/src/index";
import { AuditLog, User } from "../../../../server/src/models";
import { setCurrentMailCatcher } from "../../../../server/src/lib/mail-catcher";
import type { MailCatcher } from "../../../../server/src/lib/mail-catcher";
import { resetDatabase } from "../../../setup/db";
import { startMailCatcher } from "../../support/stack";
import { agentFor, createUser } from "../../support/accounts";

let app: ReturnType<typeof createApp>;
let catcher: MailCatcher;
beforeAll(async () => {
  await resetDatabase();
  catcher = await startMailCatcher();
  app = createApp();
});
afterAll(async () => {
  await catcher.close();
  await shutdownServerResources();
});

describe("admin: users and roles", () => {
  it("lists users paginated, filtered by role and by e-mail", async () => {
    const admin = await createUser({ role: "admin", email: "boss@example.test" });
    for (let i = 0; i < 5; i++) await createUser({ email: `heath${i}@moor.test` });
    await createUser({ role: "curator", email: "keeper@moor.test" });
    const { agent } = await agentFor(app, admin.email);

    const page1 = await agent.get("/api/v1/users?pageSize=3&page=1");
    expect(page1.status).toBe(200);
    expect(page1.body.meta).toEqual({ total: 7, page: 1, pageSize: 3 });
    expect(page1.body.data).toHaveLength(3);
    const page3 = await agent.get("/api/v1/users?pageSize=3&page=3");
    expect(page3.body.data).toHaveLength(1);
    const ids = new Set([...page1.body.data, ...(await agent.get("/api/v1/users?pageSize=3&page=2")).body.data, ...page3.body.data].map((u: { id: number }) => u.id));
    expect(ids.size).toBe(7);
    expect(page1.body.data[0]).not.toHaveProperty("passwordHash");

    const curators = await agent.get("/api/v1/users?role=curator");
    expect(curators.body.data.map((u: { email: string }) => u.email)).toEqual(["keeper@moor.test"]);
    const heath = await agent.get("/api/v1/users?email=HEATH");
    expect(heath.body.meta.total).toBe(5);
    // LIKE wildcards in the filter are taken literally.
    expect((await agent.get("/api/v1/users?email=%25")).body.meta.total).toBe(0);

    const bad = await agent.get("/api/v1/users?role=overlord&pageSize=1000");
    expect(bad.status).toBe(400);
    expect(bad.body.details.map((d: { path: string }) => d.path).sort()).toEqual(["pageSize", "role"]);
  });

  it("changes a role with an audit-log row, and keeps at least one admin", async () => {
    await resetDatabase();
    const admin = await createUser({ role: "admin" });
    const person = await createUser();
    const a = await agentFor(app, admin.email);

    const res = await a.agent.patch(`/api/v1/users/${person.id}/role`).set("x-csrf-token", a.csrf).send({ role: "curator" });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: person.id, role: "curator" });
    expect((await User.findByPk(person.id))!.role).toBe("curator");
    const log = await AuditLog.findAll({ where: { action: "role.changed" } });
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({ actorId: admin.id, entityType: "user", entityId: String(person.id) });
    expect(log[0].details).toMatchObject({ from: "depositor", to: "curator" });

    // The promoted person's next request already carries the new role.
    const p = await agentFor(app, person.email);
    expect((await p.agent.get("/api/v1/auth/session")).body.user.role).toBe("curator");

    const self = await a.agent.patch(`/api/v1/users/${admin.id}/role`).set("x-csrf-token", a.csrf).send({ role: "depositor" });
    expect(self.status).toBe(409);
    expect(self.body.message).toMatch(/last admin/);
    expect((await User.findByPk(admin.id))!.role).toBe("admin");

    const invalid = await a.agent.patch(`/api/v1/users/${person.id}/role`).set("x-csrf-token", a.csrf).send({ role: "emperor" });
    expect(invalid.status).toBe(422);
    expect(invalid.body.details[0].path).toBe("/role");
    expect((await a.agent.patch(`/api/v1/users/99999/role`).set("x-csrf-token", a.csrf).send({ role: "curator" })).status).toBe(404);

    // With a second admin, the first may step down.
    await a.agent.patch(`/api/v1/users/${person.id}/role`).set("x-csrf-token", a.csrf).send({ role: "admin" });
    const step = await a.agent.patch(`/api/v1/users/${admin.id}/role`).set("x-csrf-token", a.csrf).send({ role: "curator" });
    expect(step.status).toBe(200);
    expect(await AuditLog.count({ where: { action: "role.changed" } })).toBe(3);
    expect((await a.agent.get("/api/v1/users")).status).toBe(403);
  });
});

describe("admin: outbox", () => {
  it("lists and opens messages captured by the local mail catcher, and says so when none runs", async () => {
    const admin = await createUser({ role: "admin" });
    const a = await agentFor(app, admin.email);
    await a.agent.post("/api/v1/auth/password-reset").set("x-csrf-token", a.csrf).send({ email: admin.email });
    await catcher.waitFor((m) => m.to.includes(admin.email));
    const list = await a.agent.get("/api/v1/outbox");
    expect(list.status).toBe(200);
    const item = list.body.data.find((m: { to: string[] }) => m.to.includes(admin.email));
    expect(item).toMatchObject({ subject: "Reset your Tanglebank password" });
    expect(item.links.some((l: string) => l.includes("/reset-password?token="))).toBe(true);
    const one = await a.agent.get(`/api/v1/outbox/${item.id}`);
    expect(one.status).toBe(200);
    expect(one.body.text).toContain("Choose a new password");
    expect((await a.agent.get("/api/v1/outbox/424242")).status).toBe(404);
    const notAnId = await a.agent.get("/api/v1/outbox/latest");
    expect(notAnId.status).toBe(404);
    expect(notAnId.body.message).toBe("No such message.");
    const mine = await a.agent.get("/api/v1/outbox").query({ to: admin.email.toUpperCase() });
    expect(mine.body.data.length).toBeGreaterThanOrEqual(1);
    expect(mine.body.data.every((m: { to: string[] }) => m.to.includes(admin.email))).toBe(true);
    const tooLong = await a.agent.get("/api/v1/outbox").query({ to: "x".repeat(255) });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.details).toEqual([{ path: "to", message: "to must be text of at most 254 characters." }]);

    setCurrentMailCatcher(undefined);
    const none = await a.agent.get("/api/v1/outbox");
    expect(none.status).toBe(404);
    expect(none.body.code).toBe("no_mail_catcher");
    setCurrentMailCatcher(catcher);
  });
});
