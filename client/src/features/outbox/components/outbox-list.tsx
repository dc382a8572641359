import { Link } from "react-router-dom";
import { Alert } from "../../../components/ui/form";
import { useOutbox } from "../api/get-outbox";

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: "medium", timeStyle: "short" });
}

/** Development mail viewer: every message the local mail catcher received, newest first. */
export function OutboxList({ messageHref }: { messageHref: (id: number) => string }) {
  const outbox = useOutbox();
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-bold text-moss-700">Outbox</h1>
        <p className="mt-1 text-stone-700">
          Mail the app sent in development, caught by the local mail catcher instead of being delivered. Links work as they would in the real e-mail.
        </p>
      </div>
      {outbox.error && <Alert tone="error" title="No outbox here">{outbox.error.message}</Alert>}
      {outbox.data && outbox.data.data.length === 0 && <Alert tone="info">No mail yet. Sign-ups and password resets send mail.</Alert>}
      {outbox.data && outbox.data.data.length > 0 && (
        <ul className="divide-y divide-stone-200 rounded-lg bg-white ring-1 ring-stone-200">
          {outbox.data.data.map((m) => (
            <li key={m.id} className="p-4">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <Link to={messageHref(m.id)} className="font-semibold text-moss-700 underline">
                  {m.subject || "(no subject)"}
                </Link>
                <span className="text-sm text-stone-600">{when(m.receivedAt)}</span>
              </div>
              <p className="mt-1 text-sm text-stone-700">To: {m.to.join(", ")}</p>
              {m.links.length > 0 && (
                <ul className="mt-2 space-y-1 text-sm">
                  {m.links.map((l) => (
                    <li key={l} className="truncate">
                      <a className="text-moss-700 underline" href={l}>{l}</a>
                    </li>
                  ))}
                </ul>
              )}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
