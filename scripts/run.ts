/**
 * The product process started by `npm start` (after scripts/start.sh has prepared the database and built
 * the client): migrates, seeds the demo scenario once, starts the local mail catcher and the web server
 * (which also runs a metrics worker), prints the URL and the demo sign-ins. SIGINT/SIGTERM stop it cleanly.
 *
 * Exit status: 0 after a clean stop; 1 when the database could not be reached (scripts/start.sh starts
 * the server again); 78 for a start-up failure that a restart cannot cure (a bad setting, a port in use, a
 * failed migration), so start.sh stops instead of trying again and again.
 */
import { join } from "node:path";
import { config, resetConfig } from "../server/src/config/env";
import { resetMailer } from "../server/src/emails/mailer";
import { migrateUp } from "../server/src/db/migrator";
import { waitForDatabase } from "../server/src/db/sequelize";
import { runUntilSignalled } from "../server/src/lib/process-run";
import { installProcessGuards } from "../server/src/lib/process-guards";
import { initModels } from "../server/src/models";
import { DEMO_ACCOUNTS, seedDemoAccounts } from "../server/src/db/seeders/demo-accounts";
import { MailCatcher, setCurrentMailCatcher } from "../server/src/lib/mail-catcher";
import { shutdownServerResources, startServer } from "../server/src/index";
import { ROOT_DIR } from "../server/src/config/paths";
import { startupTasks, shutdownTasks } from "../server/src/startup";
import { seedDemoScenarioTask } from "../server/src/db/seeders/demo-scenario";
import { DataciteStandIn } from "../server/src/lib/datacite/stand-in";
import { OrcidStandIn } from "../server/src/lib/orcid/stand-in";
import { CALLBACK_PATH as ORCID_CALLBACK_PATH } from "../server/src/api/auth/orcid.service";

const say = (msg: string) => console.log(`\x1b[1;32m[tanglebank]\x1b[0m ${msg}`);

async function main(): Promise<() => Promise<void>> {
  const cfg = config();
  installProcessGuards("server");
  await waitForDatabase(cfg.databaseUrl, { log: say });
  const applied = await migrateUp(cfg.databaseUrl);
  say(applied.length ? `Applied migrations: ${applied.join(", ")}` : "Database schema is up to date.");
  initModels();
  const created = await seedDemoAccounts();
  if (created) say(`Created ${created} demo accounts.`);

  const catcher = new MailCatcher(join(ROOT_DIR, ".data", "outbox.jsonl"));
  const mailPort = await catcher.listen(cfg.mailCatcherPort);
  setCurrentMailCatcher(catcher);
  say(`Local mail catcher (SMTP) on 127.0.0.1:${mailPort}`);
  if (!process.env.SMTP_PORT && mailPort !== cfg.smtp.port) {
    // TB_MAIL_PORT=0 picks a free port: point the app's mail at the port the catcher actually got.
    process.env.SMTP_PORT = String(mailPort);
    resetConfig();
    resetMailer();
  }

  // The local DataCite stand-in (unless TB_DATACITE_API_URL names a real service): demo DOIs, prefix 10.5072.
  let datacite: DataciteStandIn | undefined;
  if (cfg.datacite.enabled && cfg.datacite.standIn) {
    datacite = new DataciteStandIn({ repositoryId: cfg.datacite.repositoryId, password: cfg.datacite.password, prefix: cfg.datacite.prefix, storeFile: join(ROOT_DIR, ".data", "datacite.json") });
    const port = await datacite.listen(cfg.datacite.standInPort);
    process.env.TB_DATACITE_PORT = String(port);
    resetConfig();
    say(`Local DataCite stand-in (REST API) on ${datacite.url}, DOI prefix ${cfg.datacite.prefix} (test DOIs: they never resolve publicly)`);
  }

  const { url, close } = await startServer();

  // The local ORCID stand-in (unless TB_ORCID_ISSUER names the real one): sign in as a demo researcher.
  let orcid: OrcidStandIn | undefined;
  if (cfg.orcid.enabled && cfg.orcid.standIn) {
    const publicUrl = process.env.PUBLIC_URL ? config().publicUrl : url;
    orcid = new OrcidStandIn({ clientId: cfg.orcid.clientId, clientSecret: cfg.orcid.clientSecret, redirectUris: [`${publicUrl}${ORCID_CALLBACK_PATH}`] });
    const port = await orcid.listen(cfg.orcid.standInPort);
    process.env.TB_ORCID_PORT = String(port);
    if (!process.env.PUBLIC_URL) process.env.PUBLIC_URL = url;
    resetConfig();
    say(`Local ORCID stand-in (OpenID provider) on ${orcid.issuer}: "Sign in with ORCID" lists the demo researchers`);
  }
  for (const task of startupTasks) await task({ log: say });
  await seedDemoScenarioTask({ log: say });

  console.log(`
  Tanglebank is running at ${url}

  Demo sign-ins (password for all: ${DEMO_ACCOUNTS[0].password})
${DEMO_ACCOUNTS.map((a) => `    ${a.role.padEnd(10)} ${a.email.padEnd(32)} ${a.displayName}`).join("\n")}

  Mail sent by the app is caught locally: sign in as the admin and open Outbox.
  Press Ctrl-C to stop.
`);
  return async () => {
    for (const task of shutdownTasks) await task().catch(() => undefined);
    await close();
    await catcher.close();
    await datacite?.close();
    await orcid?.close();
    await shutdownServerResources();
  };
}

await runUntilSignalled(main, say, (err) =>
  console.error(`\x1b[1;31m[tanglebank]\x1b[0m The server could not start: ${err instanceof Error ? err.message : String(err)}`),
);
