/** Parts of the dataset page: study header, locality with locator map, networks, versions, audit history, tombstone. */
import { doiUrl } from "@shared/citation";
import { FigureCautions, fmtPFloor, fmtZ, nullLabel } from "../../../components/figures/significance";
import { Link } from "react-router-dom";
import type { DatasetDetail, Locality, NetworkSummary } from "@shared/types/dataset";
import type { AuditEntry } from "@shared/types/network-view";
import { paths } from "../../../config/paths";
import { WorldMap } from "../../../components/charts/world-map";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { interactionTypeColour, interactionTypeLabel } from "../../../components/charts/theme";
import type { DatasetTombstone } from "../api/get-dataset";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { KeywordList } from "../../../components/metadata/keyword-list";

const fmt = (v: number | null | undefined, d = 3) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(d));
const card = "rounded-lg bg-white p-4 ring-1 ring-stone-200";
const h2 = "text-lg font-bold text-moss-700";

const GENERALISATION: Record<string, string> = {
  exact: "as recorded",
  "0.01": "generalised to 0.01° (about 1 km) to protect the site",
  "0.1": "generalised to 0.1° (about 11 km) to protect the site",
  "1": "generalised to 1° (about 110 km) to protect the site",
};

function coord(v: number | null | undefined, pos: string, neg: string) {
  if (v === null || v === undefined) return "—";
  return `${Math.abs(v)}° ${v >= 0 ? pos : neg}`;
}

export function StudySection({ d }: { d: DatasetDetail }) {
  const md = d.metadata;
  return (
    <section aria-labelledby="study-h" className={card}>
      <h2 id="study-h" className={h2}>
        About this dataset
      </h2>
      <dl className="mt-2 grid gap-x-6 gap-y-3 text-sm md:grid-cols-[12rem_1fr]">
        <dt className="font-semibold text-stone-800">Creators</dt>
        <dd>
          <ul className="space-y-1">
            {md.creators.map((c) => (
              <li key={c.name}>
                {c.name}
                {c.affiliation && <span className="text-stone-700"> — {c.affiliation}</span>}
                {c.orcid && (
                  <>
                    {" "}
                    <a className="text-moss-700 underline" href={`https://orcid.org/${c.orcid.replace(/^https?:\/\/orcid\.org\//, "")}`} rel="noopener">
                      ORCID {c.orcid.replace(/^https?:\/\/orcid\.org\//, "")}
                    </a>
                    {d.verifiedOrcids.includes(c.orcid.replace(/^https?:\/\/orcid\.org\//, "").toUpperCase()) && (
                      <span className="ml-2 rounded bg-moss-50 px-1.5 py-0.5 text-xs font-semibold text-moss-800 ring-1 ring-moss-600" title="A Tanglebank account holding this iD verified it through ORCID's sign-in">
                        ✓ verified
                      </span>
                    )}
                  </>
                )}
              </li>
            ))}
          </ul>
        </dd>
        <dt className="font-semibold text-stone-800">Description</dt>
        <dd className="whitespace-pre-line text-stone-900">{md.description}</dd>
        {md.keywords.length > 0 && (
          <>
            <dt className="font-semibold text-stone-800">Keywords</dt>
            <dd>
              <KeywordList keywords={md.keywords} />
            </dd>
          </>
        )}
        <dt className="font-semibold text-stone-800">Licence</dt>
        <dd>
          <a className="text-moss-700 underline" href={`https://spdx.org/licenses/${md.licence}.html`} rel="noopener license">
            {md.licence}
          </a>
          {md.licence === "CC-BY-4.0" ? " — reuse with attribution (cite below)" : " — public domain dedication; citing is still good practice"}
        </dd>
        {md.publication && (
          <>
            <dt className="font-semibold text-stone-800">Source publication</dt>
            <dd>
              {md.publication.citation}{" "}
              {md.publication.doi && (
                <a className="text-moss-700 underline" href={`https://doi.org/${md.publication.doi}`} rel="noopener">
                  doi:{md.publication.doi}
                </a>
              )}
            </dd>
          </>
        )}
        {md.funding && (
          <>
            <dt className="font-semibold text-stone-800">Funding</dt>
            <dd>{md.funding}</dd>
          </>
        )}
        <dt className="font-semibold text-stone-800">Deposited by</dt>
        <dd>{d.owner.displayName}</dd>
      </dl>
    </section>
  );
}

interface Site {
  loc: Locality;
  /** A network of the site, for what its metadata marks not recorded. */
  meta: NetworkSummary["metadata"];
  networks: NetworkSummary[];
}

export function sitesOf(d: DatasetDetail): Site[] {
  const m = new Map<string, Site>();
  for (const n of d.networks) {
    const loc = n.metadata.locality;
    if (!loc) continue;
    const nr = n.metadata.notRecorded ?? {};
    const key = `${loc.placeName}|${loc.decimalLatitude}|${loc.decimalLongitude}|${n.metadata.habitat}|${nr.coordinates}|${nr.habitat}|${nr.elevation}`;
    const s = m.get(key);
    if (s) s.networks.push(n);
    else m.set(key, { loc, meta: n.metadata, networks: [n] });
  }
  return [...m.values()];
}

export function LocalitySection({ d }: { d: DatasetDetail }) {
  const sites = sitesOf(d);
  if (!sites.length) return null;
  const points = sites
    .filter((s) => typeof s.loc.decimalLatitude === "number" && typeof s.loc.decimalLongitude === "number")
    .map((s, i) => ({
      id: String(i),
      latitude: s.loc.decimalLatitude as number,
      longitude: s.loc.decimalLongitude as number,
      colour: "#b88a1c",
      title: `${s.loc.placeName}: ${coord(s.loc.decimalLatitude as number, "N", "S")}, ${coord(s.loc.decimalLongitude as number, "E", "W")}`,
    }));
  return (
    <section aria-labelledby="loc-h" className={card}>
      <h2 id="loc-h" className={h2}>
        Where
      </h2>
      <div className="mt-2 grid gap-4 lg:grid-cols-[1fr_36rem]">
        <ul className="space-y-3 text-sm">
          {sites.map((s, i) => (
            <li key={i}>
              <p className="font-semibold text-stone-900">
                {s.loc.placeName}
                {s.loc.countryCode && `, ${s.loc.countryCode}`}
              </p>
              <p className="text-stone-800">
                {typeof s.loc.decimalLatitude === "number" && typeof s.loc.decimalLongitude === "number" ? (
                  <>
                    {coord(s.loc.decimalLatitude, "N", "S")}, {coord(s.loc.decimalLongitude, "E", "W")} (WGS84, {GENERALISATION[s.loc.generalisation ?? "0.1"] ?? s.loc.generalisation})
                  </>
                ) : (
                  <>
                    Coordinates: <ValueOrNotRecorded meta={s.meta} field="coordinates" value={null} />
                  </>
                )}
                {s.loc.elevation !== undefined && s.loc.elevation !== null && ` · elevation ${s.loc.elevation} m`}
                {s.meta.notRecorded?.elevation && (
                  <>
                    {" "}
                    · elevation <ValueOrNotRecorded meta={s.meta} field="elevation" value={null} />
                  </>
                )}
              </p>
              <p className="text-stone-700">
                Habitat: <ValueOrNotRecorded meta={s.meta} field="habitat" value={s.meta.habitat} /> · networks {s.networks.map((n) => n.position).join(", ")}
              </p>
            </li>
          ))}
        </ul>
        <ChartFigure
          title="Locator map"
          caption={`${points.length} site${points.length === 1 ? "" : "s"}: the region (Mercator) and the world (Equal Earth), drawn from Natural Earth outlines shipped with Tanglebank.`}
        >
          <div className="grid grid-cols-2 gap-2">
            <WorldMap points={points} width={320} radius={6} region={30} label={`Regional map marking ${points.map((p) => p.title).join("; ")}`} />
            <WorldMap points={points} width={320} radius={5} label={`World map marking ${points.map((p) => p.title).join("; ")}`} />
          </div>
        </ChartFigure>
      </div>
    </section>
  );
}

function MetricsCell({ n }: { n: NetworkSummary }) {
  const m = n.metrics;
  if (!m || m.status === "none") return <span className="text-stone-700">not computed</span>;
  if (m.status === "queued") return <span className="rounded bg-lichen-300/60 px-1.5 text-stone-900">queued</span>;
  if (m.status === "running") return <span className="rounded bg-moss-100 px-1.5 text-stone-900">running</span>;
  if (m.status === "failed") return <span className="rounded bg-red-100 px-1.5 text-red-900">failed</span>;
  return null;
}

export function NetworksSection({ d }: { d: DatasetDetail }) {
  const v = d.version.number;
  const acc = d.accession!;
  const refs = d.networks.map((n) => n.ref).filter((r): r is string => !!r);
  return (
    <section aria-labelledby="nets-h" className={card}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="nets-h" className={h2}>
          Networks ({d.networks.length})
        </h2>
        {refs.length > 1 && (
          <Link className="text-sm font-semibold text-moss-700 underline" to={paths.compare.href(refs)}>
            Compare these networks
          </Link>
        )}
      </div>
      <div className="mt-2 overflow-x-auto">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Networks of this version with size, connectance and modularity</caption>
          <thead>
            <tr className="border-b border-stone-300">
              <th scope="col" className="px-2 py-1">#</th>
              <th scope="col" className="px-2 py-1">Network</th>
              <th scope="col" className="px-2 py-1">Type</th>
              <th scope="col" className="px-2 py-1 text-right">S (I × J)</th>
              <th scope="col" className="px-2 py-1 text-right">L</th>
              <th scope="col" className="px-2 py-1 text-right">C</th>
              <th scope="col" className="px-2 py-1 text-right">Q</th>
              <th scope="col" className="px-2 py-1 text-right">Modules</th>
              <th scope="col" className="px-2 py-1 text-right">
                z ± MC error
              </th>
              <th scope="col" className="px-2 py-1 text-right">p</th>
              <th scope="col" className="px-2 py-1">Null model</th>
              <th scope="col" className="px-2 py-1">Data</th>
            </tr>
          </thead>
          <tbody>
            {d.networks.map((n) => {
              const m = n.metrics;
              const done = m?.status === "succeeded";
              return (
                <tr key={n.position} className="border-b border-stone-100 align-top">
                  <td className="px-2 py-1">{n.position}</td>
                  <td className="px-2 py-1">
                    <Link className="font-semibold text-moss-700 underline" to={paths.networkView.href(acc, v, n.position)}>
                      {n.metadata.name || n.originalName}
                    </Link>
                    <span className="block font-mono text-xs text-stone-600">{n.ref}</span>
                    <span className="block text-xs text-stone-700">
                      Sampled <ValueOrNotRecorded meta={n.metadata} field="dates" value={n.metadata.startDate ? `${n.metadata.startDate} to ${n.metadata.endDate ?? "?"}` : null} />
                    </span>
                  </td>
                  <td className="px-2 py-1">
                    <span className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: interactionTypeColour[n.metadata.interactionType] ?? "#000" }} aria-hidden="true" />{" "}
                    {interactionTypeLabel[n.metadata.interactionType] ?? n.metadata.interactionType}
                    <span className="block text-xs text-stone-600">
                      {n.kind}
                      {n.directed ? ", directed" : ""}
                      {n.weighted ? ", weighted" : ""}
                    </span>
                  </td>
                  <td className="px-2 py-1 text-right tabular-nums">
                    {n.nNodes}
                    {n.kind === "bipartite" && ` (${n.nRows} × ${n.nCols})`}
                  </td>
                  <td className="px-2 py-1 text-right tabular-nums">{n.nLinks}</td>
                  <td className="px-2 py-1 text-right tabular-nums">{fmt(n.connectance, 3)}</td>
                  {done ? (
                    <>
                      <td className="px-2 py-1 text-right tabular-nums">{fmt(m!.Q, 3)}</td>
                      <td className="px-2 py-1 text-right tabular-nums">{m!.modules ?? "—"}</td>
                      <td className="px-2 py-1 text-right tabular-nums">
                        {fmtZ(m!.z, m!.zSe)}
                        {m!.zUnstable && <span title="z is unstable (null sd near 0 or few distinct randomizations)"> ⚠</span>}
                      </td>
                      <td className="px-2 py-1 text-right tabular-nums">{fmtPFloor(m!.p, m!.pAtFloor)}</td>
                      <td className="px-2 py-1 text-xs">
                        {nullLabel(m!.nullModel)}
                        {m!.newer?.status === "failed" && <span className="block text-amber-900">a newer computation failed; figures from run {m!.runId}</span>}
                        {m!.currentSettings === false && !m!.newer && <span className="block text-stone-600">from earlier settings (run {m!.runId})</span>}
                      </td>
                    </>
                  ) : (
                    <td className="px-2 py-1 text-right" colSpan={5}>
                      <MetricsCell n={n} />
                    </td>
                  )}
                  <td className="px-2 py-1 whitespace-nowrap">
                    {n.ref && (
                      <a className="text-moss-700 underline" href={`/api/v1/networks/${n.ref}/data.csv`} download>
                        CSV
                      </a>
                    )}{" "}
                    ·{" "}
                    <a className="text-moss-700 underline" href={`/api/v1/datasets/${acc}/versions/${v}/networks/${n.position}/file`} download>
                      original
                    </a>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="mt-2 text-xs text-stone-700">
        <p>
          z and p are against each network's primary null model, named in the row (fixed degrees: size, connectance and every degree kept); each network's
          page lists every null model, the formulas and the run history. Modules count linked nodes only.
        </p>
        <FigureCautions modules className="mt-1" />
      </div>
    </section>
  );
}

export function VersionsSection({ d }: { d: DatasetDetail }) {
  return (
    <section aria-labelledby="versions-h" className={card}>
      <h2 id="versions-h" className={h2}>
        Versions
      </h2>
      <ol className="mt-2 space-y-1 text-sm">
        {[...d.versions]
          .sort((a, b) => b.number - a.number)
          .map((v) => (
            <li key={v.number}>
              {v.number === d.version.number ? (
                <span className="font-semibold">version {v.number} (shown)</span>
              ) : v.state === "published" || v.state === "withdrawn" ? (
                <Link className="text-moss-700 underline" to={paths.datasetVersion.href(d.accession!, v.number)}>
                  version {v.number}
                </Link>
              ) : (
                <span>version {v.number}</span>
              )}{" "}
              — {v.publishedAt ? `published ${v.publishedAt.slice(0, 10)}` : v.state.replace("_", " ")}
              {v.withdrawnAt && `, withdrawn ${v.withdrawnAt.slice(0, 10)}`} · {v.networkCount} network{v.networkCount === 1 ? "" : "s"}
            </li>
          ))}
      </ol>
    </section>
  );
}

export function HistorySection({ entries, loading, error }: { entries: AuditEntry[] | undefined; loading: boolean; error: string | null }) {
  return (
    <section aria-labelledby="history-h" className={card}>
      <h2 id="history-h" className={h2}>
        Audit history <span className="text-sm font-normal text-stone-700">(visible to curators)</span>
      </h2>
      {loading && <p className="mt-2 text-sm text-stone-700">Loading…</p>}
      {error && <p className="mt-2 text-sm text-red-800">{error}</p>}
      {entries && entries.length === 0 && <p className="mt-2 text-sm text-stone-700">No recorded changes.</p>}
      {entries && entries.length > 0 && (
        <table className="mt-2 min-w-full text-left text-sm">
          <caption className="sr-only">Audit history, newest first</caption>
          <thead>
            <tr className="border-b border-stone-300">
              <th scope="col" className="px-2 py-1">When (UTC)</th>
              <th scope="col" className="px-2 py-1">Who</th>
              <th scope="col" className="px-2 py-1">What</th>
              <th scope="col" className="px-2 py-1">Details</th>
            </tr>
          </thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id} className="border-b border-stone-100 align-top">
                <td className="px-2 py-1 whitespace-nowrap">{e.at.slice(0, 16).replace("T", " ")}</td>
                <td className="px-2 py-1">{e.actor?.displayName ?? "system"}</td>
                <td className="px-2 py-1 font-mono text-xs">{e.action}</td>
                <td className="px-2 py-1 font-mono text-xs break-all">{Object.keys(e.details).length ? JSON.stringify(e.details) : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

export function TombstoneView({ t }: { t: DatasetTombstone }) {
  return (
    <section className="mx-auto max-w-3xl rounded-lg bg-white p-6 ring-1 ring-stone-300" aria-labelledby="tomb-h">
      <h1 id="tomb-h" className="text-2xl font-bold text-stone-900">
        {t.accession}
        {t.version ? ` v${t.version}` : ""} was withdrawn
      </h1>
      <p className="mt-3 text-stone-800">
        Withdrawn on {t.withdrawnAt.slice(0, 10)}. Its data has left the catalogue and bundles; this page keeps the accession and the citation so that
        published references still resolve.
      </p>
      <h2 className="mt-4 font-semibold text-stone-900">Reason</h2>
      <p className="mt-1 text-stone-800">{t.reason}</p>
      <h2 className="mt-4 font-semibold text-stone-900">Citation</h2>
      <p className="mt-1 rounded bg-stone-50 p-3 text-stone-900">{t.citation}</p>
      {t.doi && (
        <p className="mt-2 text-sm text-stone-800">
          Its DOI{" "}
          <a className="font-mono text-moss-700 underline" href={doiUrl(t.doi)} rel="noopener">
            {t.doi}
          </a>{" "}
          still resolves, to this page: DOIs are never deleted.
        </p>
      )}
    </section>
  );
}
