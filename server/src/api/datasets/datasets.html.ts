/**
 * Server-side HTML for dataset addresses (/datasets/TB-000042, /datasets/TB-000042/v/2, and the network
 * views below them), so that a crawler that runs no script sees what the page is: a schema.org/Dataset
 * JSON-LD block (https://schema.org/Dataset; Google's dataset guidelines list the same properties; a
 * registered DOI is the first `identifier`, a PropertyValue, and `sameAs` its resolver URL) and
 * descriptive meta tags. A withdrawn version gets a tombstone description and `noindex`; drafts and
 * unknown accessions get the plain app shell (the app then shows its 404).
 *
 * The JSON-LD is data (`type="application/ld+json"`), never executed, so the CSP's script-src 'self'
 * holds. It is serialised with `<`, `>`, `&` and U+2028/9 escaped as \uXXXX so that no value can close
 * the script element.
 */
import type { HtmlRenderer } from "../../app";
import type { NetworkMetadata, StudyMetadata } from "@shared/types/dataset";
import { licenceUrl } from "@shared/citation";
import { escapeHtml } from "../../emails/mailer";
import { config } from "../../config/env";
import { ApiError } from "../../lib/api-error";
import { Network } from "../../models";
import { citationFor, GoneError, resolveVersion, versionUrl } from "./datasets.access";
import { publicLocality } from "../../lib/public-locality";
import { doisOfDataset } from "../../dois/dois";
import { notRecordedList } from "@shared/validation/not-recorded";
import { PREVIEW_HEIGHT, PREVIEW_WIDTH } from "../previews/previews.image";

const PATH_RE = /^\/datasets\/(TB-\d{6})(?:\/v\/(\d{1,6}))?(?:\/networks\/(\d{1,6}))?\/?$/;

/** JSON safe inside <script>: no "<", ">" or "&" can appear literally. */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value)
    .replace(/</g, "\\u003c")
    .replace(/>/g, "\\u003e")
    .replace(/&/g, "\\u0026")
    .replace(/\u2028/g, "\\u2028")
    .replace(/\u2029/g, "\\u2029");
}

function orcidUrl(orcid: string): string {
  return orcid.startsWith("http") ? orcid : `https://orcid.org/${orcid}`;
}

function shorten(s: string, n = 300): string {
  const t = s.replace(/\s+/g, " ").trim();
  return t.length <= n ? t : `${t.slice(0, n - 1).trimEnd()}…`;
}

export async function buildDatasetJsonLd(accession: string, versionNumber: number | undefined) {
  const { dataset, version } = await resolveVersion(accession, versionNumber, undefined);
  const md = version.metadata as unknown as StudyMetadata;
  const dois = await doisOfDataset(dataset.id);
  const versionDoi = dois.versions.get(version.number);
  const doi = versionDoi?.state === "registered" ? versionDoi : null;
  const networks = await Network.findAll({ where: { versionId: version.id }, order: [["position", "ASC"]] });
  const url = versionUrl(accession, version.number);
  const base = config().publicUrl;
  const citation = citationFor(accession, version, doi?.doi ?? null);

  const places = new Map<string, Record<string, unknown>>();
  let start: string | null = null;
  let end: string | null = null;
  for (const n of networks) {
    const nm = n.metadata as unknown as NetworkMetadata;
    if (nm.locality) {
      const loc = publicLocality(nm.locality);
      const key = `${loc.placeName}|${loc.decimalLatitude}|${loc.decimalLongitude}`;
      if (!places.has(key)) {
        places.set(key, {
          "@type": "Place",
          name: [loc.placeName, loc.countryCode].filter(Boolean).join(", "),
          ...(loc.decimalLatitude !== null && loc.decimalLongitude !== null
            ? {
                geo: {
                  "@type": "GeoCoordinates",
                  latitude: loc.decimalLatitude,
                  longitude: loc.decimalLongitude,
                  ...(loc.elevation !== undefined ? { elevation: loc.elevation } : {}),
                },
              }
            : {}),
        });
      }
      // What is not known is said, never filled in: "Coordinates not recorded: reason."
      const notes = notRecordedList(nm).map((x) => `${x.label} not recorded: ${x.reason}`);
      if (notes.length) {
        const place = places.get(key)!;
        const prev = typeof place.description === "string" ? place.description.split("\n") : [];
        place.description = [...new Set([...prev, ...notes])].join("\n");
      }
    }
    if (nm.startDate && (!start || nm.startDate < start)) start = nm.startDate;
    if (nm.endDate && (!end || nm.endDate > end)) end = nm.endDate;
  }

  const creators = (md.creators ?? []).map((c) => ({
    "@type": "Person",
    name: c.name,
    ...(c.affiliation ? { affiliation: { "@type": "Organization", name: c.affiliation } } : {}),
    ...(c.orcid ? { sameAs: orcidUrl(c.orcid) } : {}),
  }));

  const ld: Record<string, unknown> = {
    "@context": "https://schema.org/",
    "@type": "Dataset",
    "@id": url,
    name: md.title,
    description: md.description && md.description.length >= 50 ? md.description : `${md.description ?? ""} Interaction network data in Tanglebank (${accession}, version ${version.number}).`.trim(),
    url,
    // the DOI first (a PropertyValue, as schema.org's Dataset guidance shows), then our own identifiers
    identifier: [...(doi ? [{ "@type": "PropertyValue", propertyID: "DOI", value: doi.doi, url: doi.url }] : []), accession, `${accession}/v${version.number}`, url],
    ...(doi ? { sameAs: doi.url } : {}),
    version: String(version.number),
    creator: creators,
    license: licenceUrl(md.licence),
    citation: md.publication?.citation
      ? [citation, md.publication.doi ? `${md.publication.citation} https://doi.org/${md.publication.doi}` : md.publication.citation]
      : citation,
    keywords: md.keywords ?? [],
    isAccessibleForFree: true,
    publisher: { "@type": "Organization", name: "Tanglebank", url: base },
    ...(version.publishedAt ? { datePublished: version.publishedAt.toISOString().slice(0, 10) } : {}),
    ...(places.size ? { spatialCoverage: [...places.values()] } : {}),
    ...(start || end ? { temporalCoverage: `${start ?? ".."}/${end ?? ".."}` } : {}),
    ...(md.funding ? { funder: { "@type": "Organization", name: md.funding } } : {}),
    distribution: networks.flatMap((n) => {
      const ref = `${accession}/v${version.number}/${n.position}`;
      const name = (n.metadata as unknown as NetworkMetadata).name ?? `Network ${n.position}`;
      return [
        { "@type": "DataDownload", name: `${name} (${ref}), matrix CSV`, encodingFormat: "text/csv", contentUrl: `${base}/api/v1/networks/${ref}/data.csv` },
        {
          "@type": "DataDownload",
          name: `${name} (${ref}), original file ${n.originalName}`,
          encodingFormat: "text/csv",
          contentUrl: `${base}/api/v1/datasets/${accession}/versions/${version.number}/networks/${n.position}/file`,
        },
      ];
    }),
  };
  return { ld, md, version, url, citation };
}

function injectHead(html: string, head: string, title: string): string {
  // our description replaces the app shell's generic one
  // Replacements are functions: a replacement string would expand "$`", "$'" and "$&" found in depositor
  // text (title, description) into copies of the page's own HTML.
  const titleTag = `<title>${escapeHtml(title)}</title>`;
  let out = html.replace(/<meta\s+name="description"[^>]*>\s*/i, "");
  out = out.replace(/<title>[\s\S]*?<\/title>/i, () => titleTag);
  if (!/<title>/i.test(out)) out = out.replace(/<head>/i, () => `<head>${titleTag}`);
  return out.replace(/<\/head>/i, () => `${head}\n</head>`);
}

/** The link-preview image of a page (drawn by /api/v1/previews). */
interface PreviewImage {
  url: string;
  alt: string;
}

function metaTags(title: string, description: string, url: string, extra = "", image: PreviewImage | null = null): string {
  const t = escapeHtml(title);
  const d = escapeHtml(description);
  return [
    `<meta name="description" content="${d}">`,
    `<meta property="og:type" content="website">`,
    `<meta property="og:title" content="${t}">`,
    `<meta property="og:description" content="${d}">`,
    `<meta property="og:url" content="${escapeHtml(url)}">`,
    ...(image
      ? [
          `<meta property="og:image" content="${escapeHtml(image.url)}">`,
          `<meta property="og:image:type" content="image/png">`,
          `<meta property="og:image:width" content="${PREVIEW_WIDTH}">`,
          `<meta property="og:image:height" content="${PREVIEW_HEIGHT}">`,
          `<meta property="og:image:alt" content="${escapeHtml(image.alt)}">`,
          `<meta name="twitter:card" content="summary_large_image">`,
        ]
      : []),
    `<link rel="canonical" href="${escapeHtml(url)}">`,
    extra,
  ]
    .filter(Boolean)
    .join("\n");
}

/**
 * A network page's own title, description and canonical address: its name, reference, kind and size,
 * place and years, and its current Q and z, then the dataset it belongs to.
 */
async function networkHead(accession: string, versionNumber: number, position: number, datasetTitle: string, datasetUrl: string) {
  const { version } = await resolveVersion(accession, versionNumber, undefined);
  const n = await Network.findOne({ where: { versionId: version.id, position } });
  if (!n) return null;
  const nm = n.metadata as unknown as NetworkMetadata;
  const ref = `${accession}/v${version.number}/${position}`;
  const name = nm.name ?? `Network ${position}`;
  const url = `${config().publicUrl}/datasets/${accession}/v/${version.number}/networks/${position}`;
  const size =
    n.kind === "bipartite"
      ? `${n.nRows} ${nm.rowLevel ?? "row nodes"} × ${n.nCols} ${nm.colLevel ?? "column nodes"}`
      : `${n.nNodes} nodes${n.directed ? ", directed" : ""}`;
  const where = nm.locality?.placeName ? ` at ${nm.locality.placeName}${nm.locality.countryCode ? ` (${nm.locality.countryCode})` : ""}` : "";
  const when = nm.startDate ? `, ${nm.startDate.slice(0, 4)}${nm.endDate && nm.endDate.slice(0, 4) !== nm.startDate.slice(0, 4) ? `–${nm.endDate.slice(0, 4)}` : ""}` : "";
  const type = (nm.interactionType ?? "interaction").replace(/-/g, " ");
  const description = `${name} (${ref}): a ${type} network of ${size}, ${n.nLinks} links${where}${when}. Module-ordered matrix, null distribution and node roles. From the dataset “${datasetTitle}”.`;
  const title = `${name} (${ref}) · Tanglebank`;
  const image: PreviewImage = {
    url: `${config().publicUrl}/api/v1/previews/${ref}.png`,
    alt: `Interaction matrix of ${name}, rows and columns ordered by module, each module shaded in its own colour`,
  };
  return { title, description, url, datasetUrl, image };
}

/**
 * True when a dataset, version or network address names nothing that may be shown (an unknown accession,
 * version or network, or a draft): the server answers it with HTTP 404 (the app then shows its page).
 */
export async function datasetPageMissing(path: string): Promise<boolean> {
  const m = PATH_RE.exec(path);
  if (!m) return false;
  try {
    const { version } = await resolveVersion(m[1], m[2] ? Number(m[2]) : undefined, undefined);
    if (m[3] && !(await Network.findOne({ where: { versionId: version.id, position: Number(m[3]) }, attributes: ["id"] }))) return true;
    return false;
  } catch (err) {
    if (err instanceof GoneError) return false;
    if (err instanceof ApiError && err.status === 404) return true;
    throw err;
  }
}

export const datasetHtmlRenderer: HtmlRenderer = async (path, indexHtml) => {
  const m = PATH_RE.exec(path);
  if (!m) return null;
  const accession = m[1];
  const versionNumber = m[2] ? Number(m[2]) : undefined;
  try {
    const { ld, md, version, url } = await buildDatasetJsonLd(accession, versionNumber);
    if (m[3]) {
      // a network page: its own title, description and canonical address; the dataset's JSON-LD stays
      const net = await networkHead(accession, version.number, Number(m[3]), md.title, url);
      if (!net) return null;
      const head =
        metaTags(net.title, shorten(net.description), net.url, `<link rel="up" href="${escapeHtml(url)}">`, net.image) + `\n<script type="application/ld+json">${jsonForScript(ld)}</script>`;
      return injectHead(indexHtml, head, net.title);
    }
    const title = `${md.title} (${accession} v${version.number}) · Tanglebank`;
    const image: PreviewImage = {
      url: `${config().publicUrl}/api/v1/previews/${accession}/v${version.number}.png`,
      alt: `Interaction matrices of the first networks of “${md.title}”, rows and columns ordered by module`,
    };
    const head = metaTags(title, shorten(md.description ?? md.title), url, "", image) + `\n<script type="application/ld+json">${jsonForScript(ld)}</script>`;
    return injectHead(indexHtml, head, title);
  } catch (err) {
    if (err instanceof GoneError) {
      const t = err.tombstone;
      const title = `Withdrawn: ${t.accession} v${t.version} · Tanglebank`;
      const desc = `This dataset version was withdrawn on ${t.withdrawnAt.slice(0, 10)}. Reason: ${t.reason} Cite as: ${t.citation}`;
      return injectHead(indexHtml, metaTags(title, shorten(desc), versionUrl(t.accession, t.version), `<meta name="robots" content="noindex">`), title);
    }
    if (err instanceof ApiError && err.status === 404) return null;
    throw err;
  }
};

