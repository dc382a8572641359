import "express-session";
import type { Role } from "./models/user.model";

export interface AuthUser {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  emailVerified: boolean;
}

declare module "express-session" {
  interface SessionData {
    userId?: number;
    csrfToken?: string;
    /** An ORCID sign-in under way: what the callback must see again (OpenID Connect state, nonce, PKCE). */
    orcidFlow?: { state: string; nonce: string; verifier: string; intent: "sign-in" | "link"; userId?: number; next?: string; at: number };
    /** An ORCID iD just verified that no account has yet: the sign-up page completes it. */
    orcidPending?: { orcid: string; givenName: string; familyName: string; at: number };
  }
}

declare global {
  namespace Express {
    interface Request {
      /** The signed-in user (session) or the token's owner (Bearer); undefined for a visitor. */
      user?: AuthUser;
      /** How the request was authenticated. */
      authVia?: "session" | "token";
      /** The API token's id when authenticated by Bearer token. */
      apiTokenId?: number;
    }
  }
}
