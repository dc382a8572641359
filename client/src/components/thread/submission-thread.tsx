/**
 * The conversation on a submission, as both sides see it: comments of the depositor and the curators,
 * the curators' decisions with their comments, and each submission, oldest first; a box to write to the
 * other side (they get it by e-mail). Presentational: the review and deposit features fetch and send.
 */
import { useId, useState } from "react";
import type { ThreadEntry } from "@shared/types/review";
import { Alert, Button } from "../ui/form";

const DECISIONS: Record<string, string> = { publish: "Published", request_changes: "Changes requested", decline: "Declined" };

function when(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: "medium", timeStyle: "short" });
}

function Entry({ e }: { e: ThreadEntry }) {
  if (e.kind === "submitted") {
    return (
      <li className="flex items-center gap-3 text-sm text-stone-700" data-testid="thread-submitted">
        <span className="h-px flex-1 bg-stone-300" aria-hidden="true" />
        <span>
          {e.round === 1 ? "Submitted" : `Submitted again (submission ${e.round})`} by {e.author} · <time dateTime={e.at}>{when(e.at)}</time>
        </span>
        <span className="h-px flex-1 bg-stone-300" aria-hidden="true" />
      </li>
    );
  }
  if (e.kind === "decision") {
    return (
      <li className="rounded-md border-l-4 border-lichen-400 bg-amber-50 px-4 py-2" data-testid="thread-decision">
        <p className="text-sm">
          <strong>{DECISIONS[e.decision] ?? e.decision}</strong> by {e.author} (curator) · <time dateTime={e.at}>{when(e.at)}</time>
        </p>
        {e.body && <p className="mt-1 whitespace-pre-wrap text-stone-900">{e.body}</p>}
      </li>
    );
  }
  return (
    <li className={`max-w-[85%] rounded-lg px-4 py-2 ring-1 ${e.own ? "ml-auto bg-moss-50 ring-moss-200" : "mr-auto bg-white ring-stone-300"}`} data-testid="thread-comment">
      <p className="text-sm text-stone-700">
        <strong className="text-stone-900">{e.own ? "You" : e.author}</strong> ({e.side === "curator" ? "curator" : "depositor"}) · <time dateTime={e.at}>{when(e.at)}</time>
      </p>
      <p className="mt-1 whitespace-pre-wrap break-words text-stone-900">{e.body}</p>
    </li>
  );
}

export interface SubmissionThreadProps {
  entries: ThreadEntry[];
  side: "depositor" | "curator";
  canComment: boolean;
  /** Sends a comment; resolves when stored (the box is then cleared). */
  onSend: (body: string) => Promise<unknown>;
  sending: boolean;
  error: string | null;
  /** Why the box is not offered (e.g. a draft). */
  closedNote?: string;
}

/** Long conversations show their latest entries; the earlier ones open on request. */
const SHOWN = 8;

export function SubmissionThread({ entries, side, canComment, onSend, sending, error, closedNote }: SubmissionThreadProps) {
  const [text, setText] = useState("");
  const [all, setAll] = useState(false);
  const hidden = all ? 0 : Math.max(0, entries.length - SHOWN);
  const id = useId();
  const other = side === "curator" ? "the depositor" : "the curators";
  return (
    <section aria-labelledby={`${id}-h`} className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-stone-200">
      <h2 id={`${id}-h`} className="text-xl font-bold text-moss-700">
        Conversation with {other}
      </h2>
      <p className="mt-1 text-sm text-stone-700">Only the depositor and the curators see it. Each message is e-mailed to {other} with a link back here.</p>
      {entries.length === 0 ? (
        <p className="mt-3 text-stone-700">No messages yet.</p>
      ) : (
        <ol className="mt-4 flex flex-col gap-3" aria-label="Messages">
          {hidden > 0 && (
            <li>
              <button type="button" onClick={() => setAll(true)} className="text-sm font-semibold text-moss-700 underline">
                Show {hidden} earlier {hidden === 1 ? "entry" : "entries"}
              </button>
            </li>
          )}
          {entries.slice(hidden).map((e) => (
            <Entry key={`${e.kind}-${e.id}`} e={e} />
          ))}
        </ol>
      )}
      {canComment ? (
        <form
          className="mt-4 border-t border-stone-200 pt-4"
          onSubmit={(ev) => {
            ev.preventDefault();
            if (text.trim()) void onSend(text).then(() => setText(""), () => undefined);
          }}
        >
          <label htmlFor={`${id}-text`} className="block text-sm font-semibold text-stone-800">
            Write to {other}
          </label>
          <textarea id={`${id}-text`} rows={4} maxLength={10000} value={text} onChange={(ev) => setText(ev.target.value)} className="mt-1 block w-full rounded border border-stone-400 px-3 py-2 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200" />
          {error && <div className="mt-2"><Alert tone="error" title={error} /></div>}
          <div className="mt-2">
            <Button busy={sending} disabled={!text.trim()}>
              Send to {other}
            </Button>
          </div>
        </form>
      ) : (
        closedNote && <p className="mt-3 text-sm text-stone-700">{closedNote}</p>
      )}
    </section>
  );
}
