/**
 * Started by `npm start`: listen for catalogue changes from other processes (LISTEN/NOTIFY) and build the
 * catalogue and search index before the first visitor asks.
 */
import { searchIndex } from "../../lib/search-index";
import { startCatalogueListener, stopCatalogueListener } from "../../lib/catalogue-events";
import { catalogueStore } from "./catalogue.store";

export async function startCatalogueTask(ctx: { log: (msg: string) => void }): Promise<void> {
  await startCatalogueListener();
  const started = Date.now();
  const n = (await catalogueStore.entries()).length;
  await searchIndex.ensure();
  ctx.log(`Catalogue ready: ${n} published networks indexed in ${Date.now() - started} ms.`);
}

export async function stopCatalogueTask(): Promise<void> {
  await stopCatalogueListener();
}
