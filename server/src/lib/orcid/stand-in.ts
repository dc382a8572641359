/**
 * A local stand-in for ORCID's OpenID Connect provider, run by `npm start` and the tests, so sign-in with
 * ORCID works offline through the real protocol (authorization code flow with PKCE, signed ID tokens,
 * discovery at /.well-known/openid-configuration). It is oidc-provider (a certified OpenID provider
 * package) configured like ORCID's: the subject is the ORCID iD, the `openid` scope, claims given_name and
 * family_name, client authentication by client_secret_post. Its sign-in page lists the invented
 * researchers of the demo scenario (db/seeders/demo-researchers.ts): choose one to "sign in" as them.
 * Production points TB_ORCID_ISSUER at https://orcid.org instead; nothing else changes.
 */
import { generateKeyPairSync, randomBytes } from "node:crypto";
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import Provider, { type Configuration } from "oidc-provider";
import { DEMO_RESEARCHERS, type DemoResearcher } from "../../db/seeders/demo-researchers";
import { escapeHtml } from "../../emails/mailer";

export interface OrcidStandInOptions {
  clientId: string;
  clientSecret: string;
  /** Redirect URIs the client may use (exact match, as ORCID requires). */
  redirectUris: string[];
  researchers?: DemoResearcher[];
}

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title>
<style>body{font-family:system-ui,sans-serif;max-width:40rem;margin:2rem auto;padding:0 1rem;color:#1c1917}h1{font-size:1.4rem}
.note{background:#fef9c3;border:1px solid #ca8a04;padding:.5rem .75rem;border-radius:.25rem}
button{display:block;width:100%;text-align:left;margin:.4rem 0;padding:.6rem .8rem;border:1px solid #57534e;border-radius:.3rem;background:#fff;font-size:1rem;cursor:pointer}
button:hover{background:#f5f5f4}.id{font-family:monospace;color:#44403c}.cancel{border-color:#b91c1c;color:#b91c1c}</style></head><body>${body}</body></html>`;
}

export class OrcidStandIn {
  private server?: Server;
  private provider?: Provider;
  port = 0;

  constructor(private readonly opts: OrcidStandInOptions) {}

  get issuer(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  get researchers(): DemoResearcher[] {
    return this.opts.researchers ?? DEMO_RESEARCHERS;
  }

  private configuration(): Configuration {
    const people = new Map(this.researchers.map((r) => [r.orcid, r]));
    const { privateKey } = generateKeyPairSync("rsa", { modulusLength: 2048 });
    const jwk = { ...privateKey.export({ format: "jwk" }), kid: "stand-in-1", alg: "RS256", use: "sig" };
    return {
      clients: [
        {
          client_id: this.opts.clientId,
          client_secret: this.opts.clientSecret,
          redirect_uris: this.opts.redirectUris,
          response_types: ["code"],
          grant_types: ["authorization_code"],
          token_endpoint_auth_method: "client_secret_post",
        },
      ],
      jwks: { keys: [jwk as never] },
      cookies: { keys: [randomBytes(32).toString("hex")] },
      pkce: { required: () => true },
      scopes: ["openid"],
      claims: { openid: ["sub", "given_name", "family_name"] },
      features: { devInteractions: { enabled: false } },
      interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
      ttl: { Interaction: 600, Session: 3600, Grant: 3600, AuthorizationCode: 60, IdToken: 600, AccessToken: 600 },
      findAccount: async (_ctx, sub) => {
        const r = people.get(sub);
        if (!r) return undefined;
        return { accountId: sub, claims: async () => ({ sub, given_name: r.givenName, family_name: r.familyName }) };
      },
      // ORCID asks nothing more of a person who signed in: the grant of the openid scope is automatic
      loadExistingGrant: async (ctx) => {
        const clientId = ctx.oidc.client!.clientId;
        const session = ctx.oidc.session!;
        const existing = session.grantIdFor(clientId);
        if (existing) return ctx.oidc.provider.Grant.find(existing);
        const grant = new ctx.oidc.provider.Grant({ clientId, accountId: session.accountId! });
        grant.addOIDCScope("openid");
        await grant.save();
        session.grantIdFor(clientId, grant.jti);
        return grant;
      },
    };
  }

  private async interaction(req: IncomingMessage, res: ServerResponse, provider: Provider): Promise<void> {
    const url = new URL(req.url ?? "/", this.issuer);
    const m = /^\/interaction\/([^/]+)(\/(login|abort))?$/.exec(url.pathname);
    if (!m) return void res.writeHead(404).end("Not found");
    if (req.method === "GET" && !m[2]) {
      const details = await provider.interactionDetails(req, res);
      const buttons = this.researchers
        .map((r) => `<button name="orcid" value="${escapeHtml(r.orcid)}">${escapeHtml(`${r.givenName} ${r.familyName}`)} <span class="id">${escapeHtml(r.orcid)}</span> — ${escapeHtml(r.affiliation)}</button>`)
        .join("");
      res.writeHead(200, { "Content-Type": "text/html; charset=utf-8", "Cache-Control": "no-store" });
      res.end(
        page(
          "Sign in — ORCID stand-in",
          `<h1>ORCID stand-in: sign in</h1><p class="note">This is the local stand-in for ORCID's sign-in (development and tests only). Choose an invented researcher of the Northmoor Field Station scenario; their iDs are made up.</p>
<p>${escapeHtml(String(details.params.client_id))} asks to read your ORCID iD and name.</p>
<form method="post" action="/interaction/${escapeHtml(details.uid)}/login">${buttons}</form>
<form method="post" action="/interaction/${escapeHtml(details.uid)}/abort"><button class="cancel">Cancel: do not share my iD</button></form>`,
        ),
      );
      return;
    }
    if (req.method === "POST" && m[3] === "login") {
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      const orcid = new URLSearchParams(Buffer.concat(chunks).toString("utf8")).get("orcid") ?? "";
      if (!this.researchers.some((r) => r.orcid === orcid)) return void res.writeHead(400).end("Unknown researcher");
      await provider.interactionFinished(req, res, { login: { accountId: orcid } }, { mergeWithLastSubmission: false });
      return;
    }
    if (req.method === "POST" && m[3] === "abort") {
      await provider.interactionFinished(req, res, { error: "access_denied", error_description: "The researcher declined to share their ORCID iD." }, { mergeWithLastSubmission: false });
      return;
    }
    res.writeHead(405).end("Method not allowed");
  }

  async listen(port: number, host = "127.0.0.1"): Promise<number> {
    const server = createServer();
    await new Promise<void>((resolve, reject) => {
      server.once("error", reject);
      server.listen(port, host, () => resolve());
    });
    const a = server.address();
    this.port = typeof a === "object" && a ? a.port : port;
    const provider = new Provider(this.issuer, this.configuration());
    const callback = provider.callback();
    server.on("request", (req, res) => {
      if (req.url?.startsWith("/interaction/")) {
        this.interaction(req, res, provider).catch((err: unknown) => {
          if (!res.headersSent) res.writeHead(400, { "Content-Type": "text/plain" });
          res.end(`The sign-in could not go on: ${err instanceof Error ? err.message : String(err)}`);
        });
      } else void callback(req, res);
    });
    this.server = server;
    this.provider = provider;
    return this.port;
  }

  close(): Promise<void> {
    return new Promise((resolve) => (this.server ? this.server.close(() => resolve()) : resolve()));
  }
}
