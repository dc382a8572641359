/** /collections — the signed-in user's collections, newest first, with how to make one. */
import { Link } from "react-router-dom";
import { Alert } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useMyCollections } from "../api/get-collections";

export function MyCollectionsPage({ signedIn }: { signedIn: boolean }) {
  const q = useMyCollections(signedIn);
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-bold text-moss-700">Collections</h1>
      <p className="max-w-3xl text-stone-800">
        A collection is a named set of networks — for example the exact set a meta-analysis used — with a stable link, a citation, and a bundle of everything in it. It
        points to exact dataset versions, so it never drifts. Make one from the{" "}
        <Link className="font-semibold text-moss-700 underline" to={paths.catalogue.href()}>
          catalogue
        </Link>
        : select networks (or filter), then “Save as collection”.
      </p>
      {!signedIn ? (
        <Alert tone="info">
          <Link className="font-semibold underline" to={paths.signIn.href(paths.collections.href())}>
            Sign in
          </Link>{" "}
          to see and save your collections. Public collections can be opened by anyone with their link.
        </Alert>
      ) : q.isPending ? (
        <p className="text-stone-700">Loading…</p>
      ) : q.error ? (
        <Alert tone="error">{q.error.message}</Alert>
      ) : q.data.data.length === 0 ? (
        <p className="text-stone-700">You have no collections yet.</p>
      ) : (
        <ul className="space-y-2">
          {q.data.data.map((c) => (
            <li key={c.code} className="rounded-lg bg-white p-3 ring-1 ring-stone-200">
              <Link className="text-lg font-semibold text-moss-700 underline" to={paths.collection.href(c.code)}>
                {c.name}
              </Link>
              <p className="text-sm text-stone-700">
                <span className="font-mono">{c.code}</span> · revision {c.revision} · {c.memberCount} network{c.memberCount === 1 ? "" : "s"}
                {c.withdrawnCount ? ` (${c.withdrawnCount} withdrawn)` : ""} · {c.visibility} · updated {new Date(c.updatedAt).toLocaleDateString("en-GB")}
              </p>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
