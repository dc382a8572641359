import { redirect, type LoaderFunctionArgs } from "react-router-dom";
import { queryClient } from "../../../lib/query-client";
import { getSessionQueryOptions } from "../api/get-session";
import { hasRole } from "@shared/types/auth";
import { paths } from "../../../config/paths";

export { hasRole };

/**
 * A route loader for signed-in pages: a visitor is sent to the sign-in page with `?next=` back here.
 * (A signed-in person whose role is too low sees the page's own "not allowed" message.)
 */
export function requireSignedInLoader() {
  return async ({ request }: LoaderFunctionArgs) => {
    const session = await queryClient.ensureQueryData(getSessionQueryOptions());
    if (!session.user) {
      const url = new URL(request.url);
      throw redirect(paths.signIn.href(url.pathname + url.search));
    }
    return null;
  };
}
