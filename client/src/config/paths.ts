/** Every client route path in one typed place. `href` builds a link, `path` is the router pattern. */
export const paths = {
  home: { path: "/", href: () => "/" },
  catalogue: { path: "/catalogue", href: () => "/catalogue" },
  deposit: { path: "/deposit", href: () => "/deposit" },
  depositResume: { path: "/deposit/:versionId", href: (versionId: number) => `/deposit/${versionId}` },
  myDeposits: { path: "/my-deposits", href: () => "/my-deposits" },
  reviewQueue: { path: "/review", href: () => "/review" },
  review: { path: "/review/:versionId", href: (versionId: number) => `/review/${versionId}` },
  pipeline: { path: "/admin/pipeline", href: () => "/admin/pipeline" },
  users: { path: "/admin/users", href: () => "/admin/users" },
  outbox: { path: "/admin/outbox", href: () => "/admin/outbox" },
  outboxMessage: { path: "/admin/outbox/:id", href: (id: number) => `/admin/outbox/${id}` },
  signIn: { path: "/sign-in", href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in") },
  signUp: { path: "/sign-up", href: () => "/sign-up" },
  orcidSignUp: { path: "/sign-up/orcid", href: () => "/sign-up/orcid" },
  verifyEmail: { path: "/verify-email", href: () => "/verify-email" },
  forgotPassword: { path: "/forgot-password", href: () => "/forgot-password" },
  resetPassword: { path: "/reset-password", href: () => "/reset-password" },
  account: { path: "/account", href: () => "/account" },
  // dataset pages, network views, compare, coverage map
  dataset: { path: "/datasets/:accession", href: (accession: string) => `/datasets/${accession}` },
  datasetVersion: { path: "/datasets/:accession/v/:n", href: (accession: string, n: number) => `/datasets/${accession}/v/${n}` },
  networkView: { path: "/datasets/:accession/v/:n/networks/:pos", href: (accession: string, n: number, pos: number) => `/datasets/${accession}/v/${n}/networks/${pos}` },
  compare: {
    path: "/compare",
    href: (refs?: string[], opts: { collection?: string; revision?: number } = {}) => {
      const q = new URLSearchParams();
      if (refs?.length) q.set("refs", refs.join(","));
      if (opts.collection) q.set("collection", opts.collection);
      if (opts.revision) q.set("revision", String(opts.revision));
      const s = q.toString().replace(/%2F/g, "/").replace(/%2C/g, ",");
      return s ? `/compare?${s}` : "/compare";
    },
  },
  collections: { path: "/collections", href: () => "/collections" },
  collection: { path: "/collections/:code", href: (code: string, revision?: number) => `/collections/${code}${revision ? `?revision=${revision}` : ""}` },
  coverageMap: { path: "/map", href: () => "/map" },
  // catalogue and API
  apiDocs: { path: "/api-docs", href: () => "/api-docs" },
} as const;
