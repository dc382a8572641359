/**
 * The API documentation, rendered from the OpenAPI document itself (no outside script): a getting-started
 * section with examples in curl, R and Python, then every operation grouped by tag with its parameters
 * and answers.
 */
import { FigureCautions } from "../../../components/figures/significance";
import { Link } from "react-router-dom";
import { Alert } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useOpenApi, type OpenApiOperation } from "../api/get-openapi";

function Code({ label, children }: { label: string; children: string }) {
  return (
    <figure className="mt-2">
      <figcaption className="text-xs font-semibold text-stone-700">{label}</figcaption>
      {/* focusable so that keyboard users can scroll long lines */}
      <pre tabIndex={0} aria-label={`${label} example`} className="mt-1 overflow-x-auto rounded bg-stone-900 p-3 text-sm text-stone-50 focus:outline-none focus:ring-2 focus:ring-lichen-400">
        <code>{children}</code>
      </pre>
    </figure>
  );
}

const METHOD_LOOK: Record<string, string> = {
  get: "bg-moss-700 text-white",
  post: "bg-lichen-600 text-stone-900",
  put: "bg-stone-700 text-white",
  patch: "bg-stone-700 text-white",
  delete: "bg-red-800 text-white",
};

function anchorOf(op: OpenApiOperation): string {
  return `op-${op.operationId}`;
}

function Operation({ method, path, op }: { method: string; path: string; op: OpenApiOperation }) {
  return (
    <article id={anchorOf(op)} className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h4 className="flex flex-wrap items-center gap-2 font-mono text-sm">
        <span className={`rounded px-2 py-0.5 text-xs font-bold uppercase ${METHOD_LOOK[method] ?? "bg-stone-700 text-white"}`}>{method}</span>
        <span className="break-all text-stone-900">/api/v1{path}</span>
      </h4>
      {op.summary && <p className="mt-2 text-stone-800">{op.summary}</p>}
      {op.description && <p className="mt-1 text-sm text-stone-700">{op.description}</p>}
      {op.security?.some((s) => "session" in s || "bearerToken" in s) && !op.security.some((s) => Object.keys(s).length === 0) && (
        <p className="mt-1 text-sm text-stone-700">Needs an account (browser session or API token).</p>
      )}
      {op.parameters && op.parameters.length > 0 && (
        <table className="mt-3 w-full text-left text-sm">
          <caption className="sr-only">Parameters of {op.operationId}</caption>
          <thead className="text-stone-700">
            <tr>
              <th scope="col" className="py-1 pr-3 font-semibold">Parameter</th>
              <th scope="col" className="py-1 pr-3 font-semibold">In</th>
              <th scope="col" className="py-1 font-semibold">Meaning</th>
            </tr>
          </thead>
          <tbody>
            {op.parameters.map((p) => (
              <tr key={`${p.in}-${p.name}`} className="border-t border-stone-100 align-top">
                <td className="py-1 pr-3 font-mono text-stone-900">
                  {p.name}
                  {p.required ? " *" : ""}
                </td>
                <td className="py-1 pr-3 text-stone-700">{p.in}</td>
                <td className="py-1 text-stone-800">
                  {p.description}
                  {p.schema?.enum && <span className="block text-xs text-stone-600">One of: {p.schema.enum.join(", ")}</span>}
                  {p.example !== undefined && <span className="block text-xs text-stone-600">Example: {String(p.example)}</span>}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <dl className="mt-3 flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {Object.entries(op.responses).map(([code, r]) => (
          <div key={code} className="flex gap-1">
            <dt className="font-mono font-semibold text-stone-900">{code}</dt>
            <dd className="text-stone-700">{r.description}</dd>
          </div>
        ))}
      </dl>
    </article>
  );
}

export function ApiDocsPage() {
  const doc = useOpenApi();
  if (doc.error) return <Alert tone="error">{doc.error.message}</Alert>;
  if (!doc.data) return <p role="status">Loading the API description…</p>;
  const d = doc.data;
  const base = d.servers[0]?.url ?? `${window.location.origin}/api/v1`;
  const byTag = new Map<string, Array<{ method: string; path: string; op: OpenApiOperation }>>();
  for (const [path, item] of Object.entries(d.paths)) {
    for (const [method, op] of Object.entries(item)) {
      const tag = op.tags?.[0] ?? "Other";
      if (!byTag.has(tag)) byTag.set(tag, []);
      byTag.get(tag)!.push({ method, path, op });
    }
  }
  const example = `${base}/catalogue?interactionType=pollination&country=NO&sort=z&order=desc&pageSize=100`;
  return (
    <div className="mx-auto max-w-5xl space-y-6">
      <div>
        <h1 className="text-2xl font-bold text-moss-700">{d.info.title}</h1>
        <p className="mt-1 text-stone-700">{d.info.summary}</p>
        <p className="mt-2 text-sm text-stone-700">{d.info.description}</p>
        <p className="mt-2 text-sm text-stone-700">
          Machine-readable description (OpenAPI {d.openapi}):{" "}
          <a className="font-semibold text-moss-700 underline" href="/api/v1/openapi.json">
            /api/v1/openapi.json
          </a>
          . Personal API tokens are made on your{" "}
          <Link className="font-semibold text-moss-700 underline" to={paths.account.href()}>
            account page
          </Link>
          .
        </p>
      </div>

      <section aria-labelledby="start-heading" className="rounded-lg bg-white p-6 ring-1 ring-stone-200">
        <h2 id="start-heading" className="text-lg font-bold text-moss-700">
          Getting started
        </h2>
        <p className="mt-1 text-sm text-stone-700">Plain HTTP: any language that can fetch a URL can read the catalogue and download networks as CSV.</p>
        <h3 className="mt-4 font-bold text-stone-900">Search the catalogue</h3>
        <Code label="curl">{`curl -s '${example}'`}</Code>
        <Code label="R (httr2)">{`library(httr2)
page <- request("${base}/catalogue") |>
  req_url_query(interactionType = "pollination", country = "NO", sort = "z", order = "desc", pageSize = 100) |>
  req_perform() |>
  resp_body_json(simplifyVector = TRUE)
head(page$data[, c("ref", "title", "S", "C", "Q", "z")])`}</Code>
        <Code label="Python (requests)">{`import requests
page = requests.get("${base}/catalogue",
                    params={"interactionType": "pollination", "country": "NO", "sort": "z", "order": "desc", "pageSize": 100}).json()
for row in page["data"]:
    print(row["ref"], row["S"], row["C"], row["Q"], row["z"])`}</Code>
        <h3 className="mt-4 font-bold text-stone-900">Read one network as a matrix</h3>
        <Code label="curl">{`curl -s '${base}/networks/TB-000001/v1/1/data.csv' -o TB-000001_v1_1.csv`}</Code>
        <Code label="R (readr)">{`m <- readr::read_csv("${base}/networks/TB-000001/v1/1/data.csv")`}</Code>
        <Code label="Python (urllib + csv)">{`import csv, io, urllib.request
with urllib.request.urlopen("${base}/networks/TB-000001/v1/1/data.csv") as r:
    rows = list(csv.reader(io.TextIOWrapper(r, encoding="utf-8")))`}</Code>
        <h3 className="mt-4 font-bold text-stone-900">Download a bundle (zip with a Frictionless Data Package)</h3>
        <Code label="curl (everything matching a filter)">{`curl -s '${base}/bundles?interactionType=seed-dispersal&yearMin=2019' -o bundle.zip`}</Code>
        <Code label="curl (chosen networks, with an API token)">{`curl -s -X POST '${base}/bundles' \\
  -H 'Authorization: Bearer tb_…' -H 'Content-Type: application/json' \\
  -d '{"refs": ["TB-000001/v1/1", "TB-000002/v1/3"]}' -o bundle.zip`}</Code>
        <Code label="R">{`download.file("${base}/bundles?country=NO", "bundle.zip", mode = "wb")
unzip("bundle.zip", exdir = "bundle")
metrics <- read.csv("bundle/metrics.csv")`}</Code>
        <Code label="Python">{`import urllib.request, zipfile
urllib.request.urlretrieve("${base}/bundles?country=NO", "bundle.zip")
zipfile.ZipFile("bundle.zip").extractall("bundle")`}</Code>
        <div className="mt-3 rounded border-l-4 border-lichen-600 bg-lichen-300/30 p-3 text-sm text-stone-900">
          <p>
            Every z, Q_rel, ΔQ and p comes with its null model: in the API the top-level figures are the primary null&apos;s (<code>nullModel</code>) and{" "}
            <code>nulls</code> lists every model; the catalogue&apos;s <code>nullModel</code> parameter picks the one model of its z and p; metrics.csv has one column
            set per model (e.g. <code>curveball_z</code>). Each bundle&apos;s README.txt says how every metric was computed.
          </p>
          <FigureCautions modules className="mt-1" />
        </div>
      </section>

      <nav aria-label="API sections" className="text-sm">
        <ul className="flex flex-wrap gap-3">
          {[...byTag.keys()].map((t) => (
            <li key={t}>
              <a className="font-semibold text-moss-700 underline" href={`#tag-${t}`}>
                {t}
              </a>
            </li>
          ))}
        </ul>
      </nav>

      {[...byTag.entries()].map(([tag, ops]) => (
        <section key={tag} id={`tag-${tag}`} aria-labelledby={`tag-${tag}-heading`} className="space-y-3">
          <h2 id={`tag-${tag}-heading`} className="text-xl font-bold text-moss-700">
            {tag}
          </h2>
          {d.tags.find((t) => t.name === tag)?.description && <p className="text-stone-700">{d.tags.find((t) => t.name === tag)!.description}</p>}
          <h3 className="sr-only">Operations</h3>
          {ops.map((o) => (
            <Operation key={`${o.method} ${o.path}`} {...o} />
          ))}
        </section>
      ))}
    </div>
  );
}
