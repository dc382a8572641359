/**
 * The catalogue kept in memory: one entry per published network (a few hundred bytes each; 10,000
 * networks are a few MB). Filtering, facet counts and sorting run over this array in one pass, which is
 * much faster than a dozen SQL facet queries per page and needs no denormalised table that others must
 * keep up to date.
 *
 * Keeping it current: `refreshDataset(id)` / `removeDataset(id)` (called on NOTIFY from publish and
 * withdraw, see catalogue.events.ts), and a lazy check before each request: cheap fingerprints of
 * dataset_versions, metric_runs and app_settings, looked at most every `checkIntervalMs`. A change of
 * the version fingerprint re-reads the changed datasets (and refreshes the search index); a metric run
 * change re-reads the rows of the networks whose runs changed; a settings change reloads everything.
 */
import { QueryTypes } from "sequelize";
import { sequelize } from "../../db/sequelize";
import { searchIndex } from "./catalogue.search-index";
import { catalogueFingerprint, loadCatalogueRows, type CatalogueEntry } from "./catalogue.rows";

/** How often a request may look for changes made elsewhere (ms); tests change it on the store and reset() restores it. */
const CHECK_INTERVAL_MS = 2000;

export class CatalogueStore {
  private byId = new Map<number, CatalogueEntry>();
  private sorted: CatalogueEntry[] | null = null;
  private fingerprint: { versions: string; runs: string; settings: string } | null = null;
  private watermark: { versions: string; runs: string } | null = null;
  private checkedAt = 0;
  private loading: Promise<void> | null = null;
  checkIntervalMs = CHECK_INTERVAL_MS;

  /** All entries ordered by accession and position. */
  async entries(): Promise<CatalogueEntry[]> {
    await this.ensureCurrent();
    this.sorted ??= [...this.byId.values()].sort((a, b) => (a.accession < b.accession ? -1 : a.accession > b.accession ? 1 : a.position - b.position));
    return this.sorted;
  }

  get(networkId: number): CatalogueEntry | undefined {
    return this.byId.get(networkId);
  }

  /** Forces a check on the next request (tests, and after local writes). */
  invalidate(): void {
    this.checkedAt = 0;
  }

  /**
   * All entries, after a check that starts now (a check already running may have read the database
   * before a change this caller must see, so it is waited for and another one is made).
   */
  async current(): Promise<CatalogueEntry[]> {
    if (this.loading) await this.loading.catch(() => undefined);
    this.checkedAt = 0;
    return this.entries();
  }

  /** Empties the store and restores the check interval (tests: after the database was reset). */
  reset(): void {
    this.checkIntervalMs = CHECK_INTERVAL_MS;
    this.byId.clear();
    this.sorted = null;
    this.fingerprint = null;
    this.watermark = null;
    this.checkedAt = 0;
    searchIndex.reset();
  }

  async refreshDataset(datasetId: number): Promise<void> {
    await this.replaceDatasets([datasetId]);
    await searchIndex.refreshDataset(datasetId);
  }

  async removeDataset(datasetId: number): Promise<void> {
    for (const [id, e] of this.byId) if (e.datasetId === datasetId) this.byId.delete(id);
    this.sorted = null;
    await searchIndex.removeDataset(datasetId);
  }

  private async replaceDatasets(datasetIds: number[]): Promise<void> {
    if (!this.fingerprint) return; // not loaded yet: the first load reads everything
    const rows = await loadCatalogueRows({ datasetIds });
    const set = new Set(datasetIds);
    for (const [id, e] of this.byId) if (set.has(e.datasetId)) this.byId.delete(id);
    for (const r of rows) this.byId.set(r.networkId, r);
    this.sorted = null;
  }

  private async replaceNetworks(networkIds: number[]): Promise<void> {
    const rows = await loadCatalogueRows({ networkIds });
    for (const id of networkIds) this.byId.delete(id);
    for (const r of rows) this.byId.set(r.networkId, r);
    this.sorted = null;
  }

  private async ensureCurrent(): Promise<void> {
    if (Date.now() - this.checkedAt < this.checkIntervalMs && this.fingerprint) return;
    this.loading ??= this.check().finally(() => {
      this.loading = null;
    });
    await this.loading;
  }

  private async check(): Promise<void> {
    const fp = await catalogueFingerprint();
    const wm = await this.currentWatermark();
    const old = this.fingerprint;
    if (!old || old.settings !== fp.settings) {
      const rows = await loadCatalogueRows();
      this.byId = new Map(rows.map((r) => [r.networkId, r]));
      this.sorted = null;
      if (old) await searchIndex.rebuild();
    } else {
      if (old.versions !== fp.versions && this.watermark) {
        const ids = await this.changedDatasets(this.watermark.versions);
        await this.replaceDatasets(ids);
        for (const id of ids) await searchIndex.refreshDataset(id);
      }
      if (old.runs !== fp.runs && this.watermark) {
        const ids = await this.changedNetworks(this.watermark.runs);
        if (ids.length > 2000) {
          const rows = await loadCatalogueRows();
          this.byId = new Map(rows.map((r) => [r.networkId, r]));
          this.sorted = null;
        } else if (ids.length) {
          await this.replaceNetworks(ids);
        }
      }
    }
    this.fingerprint = fp;
    this.watermark = wm;
    this.checkedAt = Date.now();
  }

  /**
   * Database time a little before now: rows written by transactions still open when we read may carry an
   * earlier updated_at, so changes are looked for from a minute before the last check.
   */
  private async currentWatermark(): Promise<{ versions: string; runs: string }> {
    const [row] = await sequelize().query<{ t: string }>(`SELECT (now() - interval '1 minute')::text AS t`, { type: QueryTypes.SELECT });
    return { versions: row.t, runs: row.t };
  }

  private async changedDatasets(since: string): Promise<number[]> {
    const rows = await sequelize().query<{ dataset_id: number }>(
      `SELECT DISTINCT dataset_id FROM dataset_versions WHERE state IN ('published', 'withdrawn') AND updated_at >= :since`,
      { replacements: { since }, type: QueryTypes.SELECT },
    );
    return rows.map((r) => r.dataset_id);
  }

  private async changedNetworks(since: string): Promise<number[]> {
    const rows = await sequelize().query<{ network_id: number }>(
      `SELECT DISTINCT network_id FROM metric_runs WHERE updated_at >= :since`,
      { replacements: { since }, type: QueryTypes.SELECT },
    );
    return rows.map((r) => r.network_id);
  }
}

/** The process's catalogue. */
export const catalogueStore = new CatalogueStore();
