/**
 * Vitest setup file of the server project, whose files share one process per worker (vitest.config.ts:
 * `isolate: false`, so the server's modules are imported once per worker, not once per file). What one file
 * changes must not reach the next: after each file the environment is put back as it was when the file
 * started, and the settings, the mail transport and the ORCID discovery read from it are forgotten, so the
 * next file reads them afresh.
 */
import { afterAll } from "vitest";
import { resetConfig } from "../../server/src/config/env";
import { resetMailer } from "../../server/src/emails/mailer";
import { resetOrcidClient } from "../../server/src/api/auth/orcid.service";

const envAtStart = { ...process.env };

afterAll(() => {
  for (const key of Object.keys(process.env)) if (!(key in envAtStart)) delete process.env[key];
  Object.assign(process.env, envAtStart);
  resetConfig();
  resetMailer();
  resetOrcidClient();
});
