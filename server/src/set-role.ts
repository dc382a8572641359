/**
 * Gives an existing account a role from the command line: how a deployment gets its first admin (only an
 * admin can change roles in the app; README: "Deploying").
 *
 *   NODE_ENV=production DATABASE_URL=… node dist/server/set-role.js EMAIL ROLE     (compiled)
 *   npm run -s set-role -- EMAIL ROLE                                              (from the source)
 *
 * ROLE is depositor, curator or admin. The change is written to the audit log (`role.changed`, no actor,
 * `via: "command line"`); the last admin cannot be demoted. Exit status: 0 done (or nothing to change),
 * 1 no such account or the last admin, 2 bad arguments or settings.
 */
import { config } from "./config/env";
import { ROLES, type Role } from "@shared/types/auth";

const USAGE = "usage: set-role EMAIL ROLE   (ROLE: depositor, curator or admin)";

async function run(argv: string[]): Promise<number> {
  const [email, role, ...rest] = argv;
  if (!email || !role || rest.length) {
    console.error(USAGE);
    return 2;
  }
  if (!(ROLES as readonly string[]).includes(role)) {
    console.error(`set-role: unknown role "${role}"\n${USAGE}`);
    return 2;
  }
  try {
    config();
  } catch (err) {
    console.error(`set-role: ${(err as Error).message}`);
    return 2;
  }
  const { sequelize, closeSequelize } = await import("./db/sequelize");
  const { initModels, User } = await import("./models");
  const { findUserByEmail } = await import("./api/auth/auth.service");
  const { audit } = await import("./lib/audit");
  initModels();
  try {
    return await sequelize().transaction(async (t) => {
      const admins = await User.findAll({ where: { role: "admin" }, transaction: t, lock: t.LOCK.UPDATE });
      const user = await findUserByEmail(email, t);
      if (!user) {
        console.error(`set-role: no account with the e-mail address ${email} (the person signs up first)`);
        return 1;
      }
      const from = user.role;
      if (from === role) {
        console.log(`${user.email} is already ${role}.`);
        return 0;
      }
      if (from === "admin" && admins.length <= 1) {
        console.error(`set-role: ${user.email} is the last admin: make another account admin first.`);
        return 1;
      }
      user.role = role as Role;
      await user.save({ transaction: t });
      await audit({ actorId: null, action: "role.changed", entityType: "user", entityId: user.id, details: { from, to: role, email: user.email, via: "command line" } }, t);
      console.log(`${user.email}: ${from} → ${role}.`);
      return 0;
    });
  } finally {
    await closeSequelize();
  }
}

process.exitCode = await run(process.argv.slice(2));
