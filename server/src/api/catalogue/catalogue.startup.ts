/**
 * Started by `npm start`: listen for catalogue changes from other processes (LISTEN/NOTIFY) and build the
 * catalogue and search index before the first visitor asks; then, in the background, write the stored
 * matrix CSVs that published networks lack (bundles.stored-csv.ts; bundles work without them, slower).
 */
import { searchIndex } from "./catalogue.search-index";
import { startCatalogueListener, stopCatalogueListener } from "./catalogue.events";
import { catalogueStore } from "./catalogue.store";
import { fillStoredMatrixCsvs } from "../bundles/bundles.stored-csv";

export async function startCatalogueTask(ctx: { log: (msg: string) => void }): Promise<void> {
  await startCatalogueListener();
  const started = Date.now();
  const n = (await catalogueStore.entries()).length;
  await searchIndex.ensure();
  ctx.log(`Catalogue ready: ${n} published networks indexed in ${Date.now() - started} ms.`);
  const filling = Date.now();
  void fillStoredMatrixCsvs().then(
    (written) => written > 0 && ctx.log(`Bundle files: stored the matrix CSV of ${written} published networks in ${Date.now() - filling} ms.`),
    (err: unknown) => ctx.log(`Bundle files: storing matrix CSVs failed (bundles write them as they go): ${err instanceof Error ? err.message : String(err)}`),
  );
}

export async function stopCatalogueTask(): Promise<void> {
  await stopCatalogueListener();
}
