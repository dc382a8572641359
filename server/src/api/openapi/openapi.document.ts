/**
 * The OpenAPI 3.1 document of the public API. Written by hand from the routers, except the parameters and
 * request bodies of routes that mount validate(schema): those come from the same schemas (from-schemas.ts);
 * a test walks the Express
 * router and checks that every registered route is either described here or belongs to the web client's
 * own (non-public) resources listed in INTERNAL_PREFIXES, and that nothing described here is missing.
 */
import { NULL_MODELS } from "@shared/network/null-models/index";
import { FIGURE_CAUTION_SHORT } from "@shared/figures/cautions";
import { ENGINE_VERSION } from "@shared/network/version";
import { config } from "../../config/env";
import { catalogueSchema } from "../catalogue/catalogue.schemas";
import { BUNDLE_LIMIT } from "../bundles/bundles.selection";
import { createTokenSchema, revokeTokenSchema } from "../tokens/tokens.schemas";
import { networkCsvSchema, networkRefSchema, networkSchema } from "../networks/networks.schemas";
import { networkViewSchema } from "../network-views/network-views.schemas";
import { datasetSchema, datasetVersionSchema, networkFileSchema, newVersionSchema, withdrawSchema } from "../datasets/datasets.schemas";
import { datasetPreviewSchema, networkPreviewSchema } from "../previews/previews.schemas";
import { compareSchema } from "../compare/compare.schemas";
import { addMembersSchema, collectionSchema, createCollectionSchema, deleteCollectionSchema, removeMemberSchema, updateCollectionSchema } from "../collections/collections.schemas";
import { bundleBodySchema, bundleQuerySchema } from "../bundles/bundles.schemas";
import { operationInput } from "./from-schemas";
import { mapSchema } from "../coverage-map/coverage-map.schemas";

/** Resources used only by the web client (accounts, deposits, review, administration): not part of the public API. */
export const INTERNAL_PREFIXES = ["/auth/", "/account", "/users", "/outbox", "/deposits", "/reviews", "/admin", "/pipeline", "/metrics-admin", "/network-views/history"];
/** Exceptions inside internal prefixes that are public. */
export const PUBLIC_EXCEPTIONS = ["/auth/session"];

type Json = Record<string, unknown>;

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const json = (schema: Json, description = "OK") => ({ description, content: { "application/json": { schema } } });
const error = (description: string) => json(ref("Error"), description);

const catalogueGet = (summary: string) => ({
  tags: ["Catalogue"],
  summary,
  description:
    "One row per published network (the latest published version of each dataset; withdrawn networks never). `meta.facets` counts, for each filter value, the networks that value would give with every other filter applied; range facets give the minimum and maximum among the matching networks. Every row's z, Q_rel, ΔQ and p are against the one null model named in `nullModel` (and in `meta.facets.nullModel`). " + FIGURE_CAUTION_SHORT,
  ...operationInput(catalogueSchema),
  responses: { 200: json(ref("CataloguePage")), 400: error("A parameter is not valid (details name it)"), 429: error("Rate limit exceeded") },
});

const zip = { description: "A zip file, streamed", content: { "application/zip": { schema: { type: "string", contentEncoding: "binary" } } } };

export function openapiDocument(): Json {
  const server = `${config().publicUrl}/api/v1`;
  return {
    openapi: "3.1.0",
    info: {
      title: "Tanglebank API",
      version: "1.0.0",
      summary: "Read access to the Tanglebank catalogue of ecological interaction networks, their data and metrics.",
      description: `Plain HTTP and JSON. Lists are \`{ data, meta }\`; errors are \`{ code, message, details }\` where details name the parameter or field. Reads need no account; a personal API token (Account page) sent as \`Authorization: Bearer tb_…\` raises nothing but gives you your own rate-limit budget and access to your unpublished deposits. Rate limits: ${config().apiRateLimit} requests per minute per token or per IP address, announced in the \`RateLimit\` and \`RateLimit-Policy\` headers (IETF draft 8); past the limit the answer is 429. Metrics are computed by ${ENGINE_VERSION}.`,
      license: { name: "Data: CC0-1.0 or CC-BY-4.0 per dataset", identifier: "CC-BY-4.0" },
    },
    servers: [{ url: server }],
    tags: [
      { name: "Catalogue", description: "Search and filter published networks" },
      { name: "Networks", description: "One network's data (CSV or JSON) and metrics" },
      { name: "Datasets", description: "Datasets and their versions" },
      { name: "Bundles", description: "Zips of many networks with a Frictionless Data Package" },
      { name: "Tokens", description: "Personal API tokens (manage them signed in, from the Account page)" },
      { name: "Service", description: "Health, session and this document" },
    ],
    components: {
      securitySchemes: {
        bearerToken: { type: "http", scheme: "bearer", description: "A personal API token, tb_ followed by 32 characters" },
        session: { type: "apiKey", in: "cookie", name: "tb.sid", description: "The web client's session (state-changing calls also need the X-CSRF-Token header)" },
      },
      schemas: {
        Error: {
          type: "object",
          required: ["code", "message"],
          properties: {
            code: { type: "string" },
            message: { type: "string" },
            details: { type: "array", items: { type: "object", properties: { path: { type: "string" }, message: { type: "string" }, file: { type: "string" }, row: { type: "integer" }, column: { type: "integer" } } } },
          },
        },
        CatalogueRow: {
          type: "object",
          properties: {
            ref: { type: "string", example: "TB-000001/v1/1" },
            networkId: { type: "integer" },
            accession: { type: "string" },
            version: { type: "integer" },
            position: { type: "integer" },
            name: { type: "string" },
            title: { type: "string" },
            licence: { type: "string" },
            interactionType: { type: ["string", "null"] },
            kind: { type: "string", enum: ["bipartite", "unipartite"] },
            directed: { type: "boolean" },
            weighted: { type: "boolean" },
            habitat: { type: ["string", "null"] },
            country: { type: ["string", "null"] },
            placeName: { type: ["string", "null"] },
            startYear: { type: ["integer", "null"] },
            endYear: { type: ["integer", "null"] },
            S: { type: "integer", description: "nodes" },
            rows: { type: ["integer", "null"] },
            cols: { type: ["integer", "null"] },
            L: { type: "integer", description: "links" },
            C: { type: ["number", "null"], description: "connectance" },
            Q: { type: ["number", "null"], description: "optimised modularity (current pipeline settings; else the last good run, see currentSettings)" },
            modules: { type: ["integer", "null"], description: "modules holding linked nodes (isolated nodes not counted)" },
            nullModel: { type: "string", description: "the null model of z, zSe, qRel, deltaQ, p in this row (the query's nullModel; the same in every row)" },
            z: { type: ["number", "null"], description: "z against nullModel (null when the network has no figures of that model)" },
            zSe: { type: ["number", "null"], description: "Monte Carlo standard error of z" },
            qRel: { type: ["number", "null"] },
            deltaQ: { type: ["number", "null"] },
            p: { type: ["number", "null"] },
            pAtFloor: { type: "boolean", description: "p is the floor 1/(n + 1): read p ≤" },
            nullN: { type: ["integer", "null"], description: "null replicates behind z and p" },
            primaryNull: { type: ["string", "null"], description: "the network's primary null model" },
            nodf: { type: ["number", "null"] },
            metricsStatus: { type: "string", enum: ["succeeded", "none"] },
            currentSettings: { type: ["boolean", "null"], description: "false: the figures are the last good run of older settings" },
          },
        },
        Facet: { type: "array", items: { type: "object", properties: { value: { type: "string" }, count: { type: "integer" } } } },
        RangeFacet: { type: "object", properties: { min: { type: ["number", "null"] }, max: { type: ["number", "null"] } } },
        CataloguePage: {
          type: "object",
          properties: {
            data: { type: "array", items: ref("CatalogueRow") },
            meta: {
              type: "object",
              properties: {
                total: { type: "integer" },
                page: { type: "integer" },
                pageSize: { type: "integer" },
                searchMatch: {
                  type: ["string", "null"],
                  enum: ["words", "prefix", null],
                  description:
                    "How the words of `q` matched: `words` when networks have every word as a whole word (only those are returned), `prefix` when none has them all and the words matched as word beginnings; null without `q`",
                },
                facets: {
                  type: "object",
                  properties: {
                    interactionType: ref("Facet"),
                    kind: ref("Facet"),
                    weighted: ref("Facet"),
                    habitat: ref("Facet"),
                    country: ref("Facet"),
                    licence: ref("Facet"),
                    year: ref("RangeFacet"),
                    nodes: ref("RangeFacet"),
                    connectance: ref("RangeFacet"),
                    Q: ref("RangeFacet"),
                    z: ref("RangeFacet"),
                    p: ref("RangeFacet"),
                    nullModel: { type: "string", description: "The null model of z and p in every row and in the z/p filters" },
                    nullModels: { type: "array", items: { type: "object", properties: { value: { type: "string" }, count: { type: "integer" } } }, description: "Null models with figures and how many networks have each" },
                  },
                },
              },
            },
          },
        },
        Metrics: {
          type: ["object", "null"],
          description:
            "Metrics: the successful run of the current pipeline settings, else the last successful run of older settings (`currentSettings` false; a failed or newer run never hides good figures, `newer` says when one exists), else the queued/running/failed state. The top-level z, Q_rel, ΔQ and p are the primary null model's (`nullModel`); `nulls` lists every null model's figures. " + FIGURE_CAUTION_SHORT,
          properties: {
            status: { type: "string", enum: ["none", "queued", "running", "succeeded", "failed"] },
            objective: { type: "string" },
            Q: { type: ["number", "null"] },
            modules: { type: ["integer", "null"] },
            nullModel: { type: ["string", "null"], description: "The primary null model: the top-level z, qRel, deltaQ and p are against it" },
            nullN: { type: ["integer", "null"] },
            zSe: { type: ["number", "null"], description: "Monte Carlo standard error of z" },
            pSe: { type: ["number", "null"], description: "Monte Carlo standard error of p" },
            pAtFloor: { type: "boolean", description: "No null reached Q: p is the floor 1/(n + 1), read it as p ≤" },
            currentSettings: { type: "boolean" },
            newer: { type: ["object", "null"], description: "A run newer than the figures shown (failed, queued or running)", properties: { runId: { type: "integer" }, status: { type: "string" }, at: { type: ["string", "null"] }, errorKind: { type: ["string", "null"] } } },
            nulls: {
              type: "array",
              description: "Every null model's figures, primary first",
              items: {
                type: "object",
                properties: {
                  model: { type: "string", enum: [...NULL_MODELS] },
                  primary: { type: "boolean" },
                  n: { type: "integer" },
                  mean: { type: ["number", "null"] },
                  sd: { type: ["number", "null"] },
                  z: { type: ["number", "null"] },
                  zSe: { type: ["number", "null"] },
                  qRel: { type: ["number", "null"] },
                  deltaQ: { type: ["number", "null"] },
                  p: { type: ["number", "null"] },
                  pSe: { type: ["number", "null"] },
                  pAtFloor: { type: "boolean" },
                  unstable: { type: "boolean" },
                  nodfMean: { type: ["number", "null"] },
                  nodfZ: { type: ["number", "null"] },
                  nodfP: { type: ["number", "null"] },
                },
              },
            },
            nullMean: { type: ["number", "null"] },
            nullSd: { type: ["number", "null"] },
            z: { type: ["number", "null"] },
            qRel: { type: ["number", "null"] },
            p: { type: ["number", "null"] },
            nodf: { type: ["number", "null"] },
            algorithm: { type: "object", properties: { name: { type: "string" }, version: { type: "string" }, seed: { type: "integer" } } },
          },
        },
        Network: {
          type: "object",
          properties: {
            ref: { type: "string" },
            accession: { type: "string" },
            version: { type: "integer" },
            position: { type: "integer" },
            latestPublishedVersion: { type: ["integer", "null"] },
            kind: { type: "string" },
            directed: { type: "boolean" },
            weighted: { type: "boolean" },
            S: { type: "integer" },
            rows: { type: ["integer", "null"] },
            cols: { type: ["integer", "null"] },
            L: { type: "integer" },
            C: { type: ["number", "null"] },
            sha256: { type: ["string", "null"] },
            metadata: { type: "object", description: "Network metadata (/schemas/network.schema.json); coordinates generalised for sensitive sites" },
            metrics: ref("Metrics"),
            data: {
              type: "object",
              description: "With ?include=data or data.json: node labels and links [source, target, weight]",
              properties: { rowLabels: { type: "array", items: { type: "string" } }, colLabels: { type: ["array", "null"], items: { type: "string" } }, links: { type: "array", items: { type: "array", prefixItems: [{ type: "string" }, { type: "string" }, { type: "number" }], minItems: 3 } } },
            },
          },
        },
        Collection: {
          type: "object",
          description: "A saved set of networks of exact versions; revision rises with every change of its members",
          properties: {
            code: { type: "string", example: "TBC-000001" },
            name: { type: "string" },
            description: { type: "string" },
            visibility: { type: "string", enum: ["public", "private"] },
            revision: { type: "integer" },
            shownRevision: { type: "integer" },
            memberCount: { type: "integer" },
            withdrawnCount: { type: "integer" },
            members: { type: "array", items: { type: "object", properties: { ref: { type: "string" }, state: { type: "string", enum: ["published", "withdrawn"] }, withdrawal: { type: ["object", "null"] } } } },
          },
        },
        ApiToken: {
          type: "object",
          properties: { id: { type: "integer" }, name: { type: "string" }, prefix: { type: "string", example: "tb_AbCd" }, createdAt: { type: "string", format: "date-time" }, lastUsedAt: { type: ["string", "null"], format: "date-time" }, revokedAt: { type: ["string", "null"], format: "date-time" } },
        },
      },
    },
    security: [{}, { bearerToken: [] }],
    paths: {
      "/catalogue": { get: { ...catalogueGet("Search the catalogue"), operationId: "searchCatalogue" } },
      "/networks": { get: { ...catalogueGet("List networks (same as /catalogue)"), operationId: "listNetworks" } },
      "/networks/{accession}/{version}/{position}": {
        get: {
          tags: ["Networks"],
          operationId: "getNetwork",
          summary: "One network: metadata, counts and current metrics (JSON), or its data as CSV with ?format=csv",
          ...operationInput(networkSchema),
          responses: { 200: { description: "The network", content: { "application/json": { schema: ref("Network") }, "text/csv": { schema: { type: "string" } } } }, 400: error("A parameter is not valid (details name it)"), 404: error("No such published network"), 410: error("Withdrawn (the answer carries the reason)") },
        },
      },
      "/networks/{accession}/{version}/{position}/data.csv": {
        get: {
          tags: ["Networks"],
          operationId: "getNetworkCsv",
          summary: "The network as CSV: a matrix (header's first cell 'node', then the column nodes; one line per row node) or an edge list",
          description:
            "Labels are exactly as deposited. A label that begins like a spreadsheet formula (=, +, -, @) may be run as one when the file is opened in a spreadsheet program; `spreadsheetSafe=true` writes such labels with a leading apostrophe (read as text by spreadsheet programs), everything else unchanged. Scripts should read the exact form.",
          ...operationInput(networkCsvSchema),
          responses: { 200: { description: "CSV", content: { "text/csv": { schema: { type: "string" } } } }, 400: error("A parameter is not valid (details name it)"), 404: error("Not found"), 410: error("Withdrawn") },
        },
      },
      "/previews/{accession}/{version}.png": {
        get: {
          tags: ["Networks"],
          operationId: "getDatasetPreview",
          summary: "Link-preview image of a dataset version (1200 × 630 PNG): its first three networks' matrices ordered by module, each with a strip of its modules' sizes",
          ...operationInput(datasetPreviewSchema),
          responses: { 200: { description: "PNG (cached; ETag)", content: { "image/png": { schema: { type: "string", contentEncoding: "binary" } } } }, 404: error("Not found"), 410: error("Withdrawn") },
        },
      },
      "/previews/{accession}/{version}/{position}.png": {
        get: {
          tags: ["Networks"],
          operationId: "getNetworkPreview",
          summary: "Link-preview image of a network (1200 × 630 PNG): its matrix ordered by module, with a strip of its modules' sizes",
          ...operationInput(networkPreviewSchema),
          responses: { 200: { description: "PNG (cached; ETag)", content: { "image/png": { schema: { type: "string", contentEncoding: "binary" } } } }, 404: error("Not found"), 410: error("Withdrawn") },
        },
      },
      "/networks/{accession}/{version}/{position}/data.json": {
        get: { tags: ["Networks"], operationId: "getNetworkJsonData", summary: "The network with its data (labels and links) as JSON", ...operationInput(networkRefSchema), responses: { 200: json(ref("Network")), 404: error("Not found"), 410: error("Withdrawn") } },
      },
      "/networks/{accession}/{version}/{position}/metrics": {
        get: { tags: ["Networks"], operationId: "getNetworkMetrics", summary: "Current metrics of one network", ...operationInput(networkRefSchema), responses: { 200: json({ type: "object", properties: { ref: { type: "string" }, metrics: ref("Metrics") } }), 404: error("Not found"), 410: error("Withdrawn") } },
      },
      "/network-views/summaries": {
        get: { tags: ["Networks"], operationId: "getNetworkSummaries", summary: "Compact summaries of several networks (for comparisons)", description: "Rows in the order asked (at most 60). References that cannot be plotted do not fail the request: meta.unavailable lists each with its reason (malformed, unknown, withdrawn with the tombstone).", ...operationInput(compareSchema), responses: { 200: json({ type: "object" }), 400: error("No references, or too many (details name refs)") } },
      },
      "/network-views/map": {
        get: {
          tags: ["Catalogue"],
          operationId: "getCoverageMap",
          summary: "Every catalogue network matching the filters with its public (generalised) coordinates, for maps",
          ...operationInput(mapSchema),
          responses: { 200: json({ type: "object" }), 400: error("A parameter is not valid") },
        },
      },
      "/network-views/{accession}/{version}/{position}": {
        get: { tags: ["Networks"], operationId: "getNetworkView", summary: "Everything the network page plots: matrix order, partition, null distribution, roles", ...operationInput(networkViewSchema), responses: { 200: json({ type: "object" }), 404: error("Not found"), 410: error("Withdrawn") } },
      },
      "/network-views/{accession}/{version}/{position}/partition.csv": {
        get: { tags: ["Networks"], operationId: "getPartitionCsv", summary: "The best partition: node, level, module (CSV)", ...operationInput(networkViewSchema), responses: { 200: { description: "CSV", content: { "text/csv": { schema: { type: "string" } } } }, 404: error("Not found") } },
      },
      "/network-views/{accession}/{version}/{position}/partition.json": {
        get: { tags: ["Networks"], operationId: "getPartitionJson", summary: "The best partition as JSON", ...operationInput(networkViewSchema), responses: { 200: json({ type: "object" }), 404: error("Not found") } },
      },
      "/datasets/{accession}": {
        get: { tags: ["Datasets"], operationId: "getDataset", summary: "A dataset: its latest published version (or ?version=N), networks and metrics", ...operationInput(datasetSchema), responses: { 200: json({ type: "object", description: "DatasetDetail" }), 400: error("A parameter is not valid (details name it)"), 404: error("Not found"), 410: error("Withdrawn: the tombstone") } },
      },
      "/datasets/{accession}/versions/{n}": {
        get: { tags: ["Datasets"], operationId: "getDatasetVersion", summary: "One version of a dataset", ...operationInput(datasetVersionSchema), responses: { 200: json({ type: "object", description: "DatasetDetail" }), 404: error("Not found"), 410: error("Withdrawn") } },
      },
      "/datasets/{accession}/versions/{n}/networks/{pos}/file": {
        get: { tags: ["Datasets"], operationId: "getOriginalFile", summary: "The network's file exactly as deposited", ...operationInput(networkFileSchema), responses: { 200: { description: "The original bytes" }, 404: error("Not found"), 410: error("Withdrawn") } },
      },
      "/datasets/{accession}/versions": {
        post: { tags: ["Datasets"], operationId: "startNewVersion", summary: "Start a new version (owner): a draft copied from the latest", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(newVersionSchema), responses: { 201: json({ type: "object" }), 401: error("Sign in"), 403: error("Not the owner") } },
      },
      "/datasets/{accession}/withdraw": {
        post: { tags: ["Datasets"], operationId: "withdrawDataset", summary: "Withdraw a published version (curators), with a reason", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(withdrawSchema), responses: { 200: json({ type: "object" }), 403: error("Curators only"), 409: error("No published version to withdraw"), 422: error("No reason given") } },
      },
      "/bundles/estimate": {
        post: {
          tags: ["Bundles"],
          operationId: "estimateBundle",
          summary: "How many networks a selection holds and the estimated (uncompressed) size of its bundle",
          ...operationInput(bundleBodySchema),
          responses: {
            200: json({
              type: "object",
              properties: {
                count: { type: "integer", description: "Networks the bundle would hold (references that cannot be bundled left out)" },
                estimatedBytes: { type: "integer" },
                limit: { type: "integer" },
                overLimit: { type: "boolean" },
                include: { type: "array", items: { type: "string" } },
                unavailable: { type: "array", description: "References that cannot be bundled (a download naming them answers 422)", items: { type: "object", properties: { ref: { type: "string" }, reason: { type: "string", enum: ["withdrawn", "not_published"] }, message: { type: "string" } } } },
              },
            }),
            400: error("Bad selection"),
          },
        },
      },
      "/bundles": {
        get: {
          tags: ["Bundles"],
          operationId: "downloadBundle",
          summary: "Download a bundle (zip) of a selection (refs) or of every network matching catalogue filters",
          description: `The zip holds datapackage.json (Frictionless Data Package with a Table Schema per CSV), networks/ACCESSION_vN_POS.csv (matrices: header's first cell "node", then the column nodes; one line per row node, as /networks/…/data.csv), metrics.csv, networks.csv (public coordinates), CITATIONS.bib (a @dataset entry per version and its source publication) and README.txt (how every metric was computed), plus the optional parts chosen with include: partitions.csv, roles.csv, null_distribution.csv, edges.csv, originals/. Every table about networks starts with network_ref (TB-000042/v2/3). At most ${BUNDLE_LIMIT} networks (413 beyond).`,
          ...operationInput(bundleQuerySchema),
          responses: { 200: zip, 400: error("Bad selection"), 413: error(`More than ${BUNDLE_LIMIT} networks`), 422: error("Some references are not published networks") },
        },
        post: {
          tags: ["Bundles"],
          operationId: "downloadBundlePost",
          summary: "Download a bundle, the selection in a JSON body (for long lists of references)",
          ...operationInput(bundleBodySchema),
          responses: { 200: zip, 400: error("Bad selection"), 413: error(`More than ${BUNDLE_LIMIT} networks`), 422: error("Some references are not published networks") },
        },
      },
      "/collections": {
        get: { tags: ["Collections"], operationId: "listMyCollections", summary: "Your collections (saved sets of networks), newest first", security: [{ session: [] }, { bearerToken: [] }], responses: { 200: json({ type: "object", properties: { data: { type: "array", items: ref("Collection") } } }), 401: error("Sign in") } },
        post: {
          tags: ["Collections"],
          operationId: "createCollection",
          summary: "Save networks as a collection: explicit references, or every network matching a catalogue filter (frozen to their versions)",
          security: [{ session: [] }, { bearerToken: [] }],
          ...operationInput(createCollectionSchema),
          responses: { 201: json(ref("Collection")), 400: error("Missing name, or neither refs nor filter"), 401: error("Sign in"), 422: error("Some references are not published networks") },
        },
      },
      "/collections/{code}": {
        get: {
          tags: ["Collections"],
          operationId: "getCollection",
          summary: "A collection with its members (exact versions; withdrawn members with their tombstone). Private: owner only (404 otherwise)",
          ...operationInput(collectionSchema),
          responses: { 200: json(ref("Collection")), 404: error("No such collection, or a private one") },
        },
        patch: { tags: ["Collections"], operationId: "updateCollection", summary: "Rename, describe, make public or private (owner)", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(updateCollectionSchema), responses: { 200: json(ref("Collection")), 403: error("Not the owner") } },
        delete: { tags: ["Collections"], operationId: "deleteCollection", summary: "Delete a collection (owner)", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(deleteCollectionSchema), responses: { 204: { description: "Deleted" }, 403: error("Not the owner") } },
      },
      "/collections/{code}/members": {
        post: { tags: ["Collections"], operationId: "addCollectionMembers", summary: "Add published networks (owner): a new revision", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(addMembersSchema), responses: { 200: json(ref("Collection")), 403: error("Not the owner"), 422: error("Some references are not published networks") } },
      },
      "/collections/{code}/members/{accession}/{version}/{position}": {
        delete: { tags: ["Collections"], operationId: "removeCollectionMember", summary: "Remove a member (owner): a new revision", security: [{ session: [] }, { bearerToken: [] }], ...operationInput(removeMemberSchema), responses: { 200: json(ref("Collection")), 403: error("Not the owner"), 404: error("Not a member") } },
      },
      "/tokens": {
        get: { tags: ["Tokens"], operationId: "listTokens", summary: "Your API tokens (prefix, name, created, last used, revoked)", security: [{ session: [] }, { bearerToken: [] }], responses: { 200: json({ type: "object", properties: { data: { type: "array", items: ref("ApiToken") } } }), 401: error("Sign in") } },
        post: {
          tags: ["Tokens"],
          operationId: "createToken",
          summary: "Create a token (signed in through the browser); the secret is shown once",
          security: [{ session: [] }],
          ...operationInput(createTokenSchema),
          responses: { 201: json({ type: "object", properties: { token: ref("ApiToken"), secret: { type: "string", example: "tb_…" } } }), 401: error("Sign in"), 403: error("Not with a token"), 422: error("Name missing") },
        },
      },
      "/tokens/{id}": {
        delete: { tags: ["Tokens"], operationId: "revokeToken", summary: "Revoke one of your tokens", security: [{ session: [] }], ...operationInput(revokeTokenSchema), responses: { 200: json({ type: "object", properties: { token: ref("ApiToken") } }), 404: error("Not your token") } },
      },
      "/health": { get: { tags: ["Service"], operationId: "health", summary: "Whether the service and its database answer", responses: { 200: json({ type: "object" }), 503: json({ type: "object" }, "Degraded") } } },
      "/auth/session": { get: { tags: ["Service"], operationId: "getSession", summary: "The signed-in user (or null) and the CSRF token for state-changing browser calls", responses: { 200: json({ type: "object", properties: { user: { type: ["object", "null"] }, csrfToken: { type: "string" } } }) } } },
      "/openapi.json": { get: { tags: ["Service"], operationId: "openapi", summary: "This document", responses: { 200: json({ type: "object" }) } } },
    },
  };
}

/** "/networks/:accession/:version/:position" → "/networks/{accession}/{version}/{position}" */
export function toOpenApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, "{$1}");
}

export function isInternal(path: string): boolean {
  if (PUBLIC_EXCEPTIONS.includes(path)) return false;
  return INTERNAL_PREFIXES.some((p) => (p.endsWith("/") ? path.startsWith(p) : path === p || path.startsWith(p + "/")));
}
