/** Shows the page only to a signed-in person with at least `min`; otherwise says what is needed. */
import type { ReactNode } from "react";
import { Link, useLocation } from "react-router-dom";
import { useSession } from "../../../features/auth/api/get-session";
import { paths } from "../../../config/paths";
import { hasRole, type Role } from "@shared/types/auth";

export function RequireUser({ min = "depositor", children }: { min?: Role; children: ReactNode }) {
  const { data, isPending } = useSession();
  const location = useLocation();
  if (isPending) return <p role="status">Loading…</p>;
  const user = data?.user;
  if (!user) {
    return (
      <section className="mx-auto max-w-xl py-8">
        <h1 className="text-2xl font-bold text-moss-700">Sign in first</h1>
        <p className="mt-3">
          <Link className="font-semibold text-moss-700 underline" to={paths.signIn.href(location.pathname + location.search)}>
            Sign in
          </Link>{" "}
          to continue.
        </p>
      </section>
    );
  }
  if (!hasRole(user, min)) {
    return (
      <section className="mx-auto max-w-xl py-8">
        <h1 className="text-2xl font-bold text-moss-700">Not available</h1>
        <p className="mt-3">This page needs the {min} role.</p>
      </section>
    );
  }
  return <>{children}</>;
}
