import { Fragment } from "react";
import { Link } from "react-router-dom";
import { Alert } from "../../../components/ui/form";
import { useOutboxMessage } from "../api/get-outbox-message";

/** The plain-text body with its addresses made clickable (the HTML body is not rendered: no mail markup runs here). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s"'<>]+)/g);
  return (
    <>
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p} className="break-all text-moss-700 underline">{p}</a>
        ) : (
          <Fragment key={i}>{p}</Fragment>
        ),
      )}
    </>
  );
}

export function OutboxMessageView({ id, backHref }: { id: number; backHref: string }) {
  const msg = useOutboxMessage(id);
  return (
    <div className="space-y-4">
      <p>
        <Link to={backHref} className="text-sm font-semibold text-moss-700 underline">← Back to the outbox</Link>
      </p>
      {msg.error && <Alert tone="error">{msg.error.message}</Alert>}
      {msg.data && (
        <article className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200">
          <h1 className="text-2xl font-bold text-moss-700">{msg.data.subject || "(no subject)"}</h1>
          <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="font-semibold text-stone-700">From</dt>
            <dd className="text-stone-800">{msg.data.from}</dd>
            <dt className="font-semibold text-stone-700">To</dt>
            <dd className="text-stone-800">{msg.data.to.join(", ")}</dd>
            <dt className="font-semibold text-stone-700">Received</dt>
            <dd className="text-stone-800">{new Date(msg.data.receivedAt).toLocaleString()}</dd>
          </dl>
          <pre className="mt-6 whitespace-pre-wrap rounded bg-stone-50 p-4 font-sans text-stone-900 ring-1 ring-stone-200">
            <Linkified text={msg.data.text} />
          </pre>
        </article>
      )}
    </div>
  );
}
