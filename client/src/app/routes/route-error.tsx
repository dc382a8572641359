import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { ApiClientError } from "../../lib/api-client";
import { NotFoundPage } from "./not-found";
import { paths } from "../../config/paths";

/** The error element of every route: 404s get the not-found page, 401/403 a sign-in hint. */
export function RouteError() {
  const err = useRouteError();
  const status = err instanceof ApiClientError ? err.status : isRouteErrorResponse(err) ? err.status : 500;
  if (status === 404) return <NotFoundPage />;
  const message = err instanceof Error ? err.message : isRouteErrorResponse(err) ? err.statusText : "Unexpected error";
  return (
    <section className="mx-auto max-w-xl py-12" role="alert">
      <h1 className="text-2xl font-bold text-red-800">{status === 401 ? "Please sign in" : status === 403 ? "Not allowed" : "Something went wrong"}</h1>
      <p className="mt-3 text-stone-700">{message}</p>
      {status === 401 && (
        <Link className="mt-4 inline-block underline text-moss-700" to={paths.signIn.href(window.location.pathname)}>Sign in</Link>
      )}
    </section>
  );
}
