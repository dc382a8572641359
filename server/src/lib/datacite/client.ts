/**
 * A small client of DataCite's REST API (JSON:API over HTTPS, HTTP Basic authentication with the
 * repository account): read a DOI, create one, update one. Node's fetch; no SDK exists. Errors keep
 * DataCite's `errors` list (source + title) so the DOI job can log what DataCite refused.
 */
export interface DataciteCredentials {
  apiUrl: string;
  repositoryId: string;
  password: string;
}

export interface DataciteErrorItem {
  status?: string;
  source?: string;
  title: string;
}

export class DataciteError extends Error {
  constructor(
    readonly status: number,
    readonly errors: DataciteErrorItem[],
  ) {
    super(`DataCite answered ${status}: ${errors.map((e) => (e.source ? `${e.source}: ${e.title}` : e.title)).join("; ") || "no detail"}`);
  }
}

export interface DoiRecord {
  id: string;
  attributes: Record<string, unknown> & { doi: string; state: "draft" | "registered" | "findable"; url?: string | null };
}

const JSON_API = "application/vnd.api+json";

/** `/dois/10.5072/tb-000042`: the prefix's slash stays a slash, as in DataCite's documented paths. */
function doiPath(doi: string): string {
  return `/dois/${doi.split("/").map(encodeURIComponent).join("/")}`;
}

export class DataciteClient {
  constructor(
    private readonly creds: DataciteCredentials,
    private readonly timeoutMs = 15_000,
  ) {}

  private async call(method: string, path: string, body?: unknown): Promise<{ status: number; json: unknown }> {
    const auth = Buffer.from(`${this.creds.repositoryId}:${this.creds.password}`).toString("base64");
    const res = await fetch(`${this.creds.apiUrl}${path}`, {
      method,
      headers: { Accept: JSON_API, Authorization: `Basic ${auth}`, ...(body ? { "Content-Type": JSON_API } : {}) },
      body: body ? JSON.stringify(body) : undefined,
      signal: AbortSignal.timeout(this.timeoutMs),
    });
    const text = await res.text();
    let json: unknown;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = null;
    }
    if (!res.ok && res.status !== 404) {
      const errors = (json as { errors?: DataciteErrorItem[] } | null)?.errors ?? [{ title: text.slice(0, 200) || res.statusText }];
      throw new DataciteError(res.status, errors);
    }
    return { status: res.status, json };
  }

  /** The DOI's record, or null when DataCite does not know it. */
  async get(doi: string): Promise<DoiRecord | null> {
    const { status, json } = await this.call("GET", doiPath(doi));
    return status === 404 ? null : ((json as { data: DoiRecord }).data ?? null);
  }

  /** Creates the DOI with these attributes (event "publish" makes it findable at once). */
  async create(attributes: Record<string, unknown> & { doi: string }): Promise<DoiRecord> {
    const { json } = await this.call("POST", "/dois", { data: { type: "dois", attributes } });
    return (json as { data: DoiRecord }).data;
  }

  /** Replaces the DOI's metadata (and URL) with these attributes. */
  async update(doi: string, attributes: Record<string, unknown>): Promise<DoiRecord> {
    const { status, json } = await this.call("PUT", doiPath(doi), { data: { id: doi, type: "dois", attributes } });
    if (status === 404) throw new DataciteError(404, [{ status: "404", title: `DOI ${doi} not found` }]);
    return (json as { data: DoiRecord }).data;
  }
}
