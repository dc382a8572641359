/**
 * Vitest setup file of the server project, whose files share one process per worker (vitest.config.ts:
 * `isolate: false`, so the server's modules are imported once per worker, not once per file). What one file
 * changes must not reach the next: after each file the environment is put back as it was when the file
 * started, and the settings, the mail transport and the ORCID discovery read from it are forgotten, so the
 * next file reads them afresh. What the server keeps in memory about the database is forgotten too (the
 * next file resets the database, and its ids start again from 1): the catalogue's entries, kept previews
 * and submission diffs, and the rate limits' counters.
 */
import { afterAll } from "vitest";
import { resetConfig } from "../../server/src/config/env";
import { resetMailer } from "../../server/src/emails/mailer";
import { resetOrcidClient } from "../../server/src/api/auth/orcid.service";
import { catalogueStore } from "../../server/src/api/catalogue/catalogue.store";
import { clearPreviewCache } from "../../server/src/api/previews/previews.service";
import { clearSubmissionDiffCache } from "../../server/src/api/reviews/reviews.diff";
import { resetRateLimits } from "../../server/src/middlewares/rate-limit";

const envAtStart = { ...process.env };

afterAll(async () => {
  for (const key of Object.keys(process.env)) if (!(key in envAtStart)) delete process.env[key];
  Object.assign(process.env, envAtStart);
  resetConfig();
  resetMailer();
  resetOrcidClient();
  catalogueStore.reset();
  clearPreviewCache();
  clearSubmissionDiffCache();
  await resetRateLimits();
});
