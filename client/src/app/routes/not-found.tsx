import { Link, useLocation } from "react-router-dom";
import { paths } from "../../config/paths";

export function NotFoundPage() {
  const { pathname } = useLocation();
  return (
    <section className="mx-auto max-w-xl py-12">
      <h1 className="text-3xl font-bold text-moss-700">Page not found</h1>
      <p className="mt-3 text-stone-700">
        There is no page at <code className="rounded bg-stone-200 px-1">{pathname}</code>. If you followed a link to a dataset, check the
        accession (it looks like <code className="rounded bg-stone-200 px-1">TB-000042</code>).
      </p>
      <ul className="mt-6 list-inside list-disc space-y-1 text-moss-700">
        <li><Link className="underline" to={paths.catalogue.href()}>Browse the catalogue</Link></li>
        <li><Link className="underline" to={paths.home.href()}>Go to the front page</Link></li>
      </ul>
    </section>
  );
}
