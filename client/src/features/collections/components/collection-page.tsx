/**
 * /collections/:code — a saved set of networks of exact versions: its members (withdrawn ones with their
 * tombstone), a stable link to the revision shown, citation text/BibTeX/RIS, bundle and compare buttons,
 * and for its owner: rename, describe, public or private, add and remove networks, delete.
 */
import { useMemo, useState, type ReactNode } from "react";
import { Link, useNavigate } from "react-router-dom";
import { collectionToBibTeX, collectionToRIS, formatCollectionCitation, type CollectionCitationInput } from "@shared/citation";
import type { CollectionDetail, CollectionMemberView } from "@shared/types/collection";
import { CitationPanel } from "../../../components/citation/citation-panel";
import { Alert, Button } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { ApiClientError } from "../../../lib/api-client";
import { useCollection } from "../api/get-collections";
import { useAddMembers, useDeleteCollection, useRemoveMember, useUpdateCollection } from "../api/mutations";

const dateOf = (iso: string) => new Date(iso).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" });
const linkLook = "inline-flex items-center rounded bg-moss-700 px-3 py-1.5 text-sm font-semibold text-white hover:bg-moss-600";

export interface CollectionPageProps {
  code: string;
  revision?: number;
  /** The bundle button for these (published) references; passed in by the route. */
  bundle: (refs: string[], title: string) => ReactNode;
}

export function CollectionPage({ code, revision, bundle }: CollectionPageProps) {
  const q = useCollection(code, revision);
  const c = q.data;
  if (q.isPending) return <p className="text-stone-700">Loading the collection…</p>;
  if (q.isError || !c) {
    const e = q.error;
    return (
      <section className="mx-auto max-w-2xl py-6">
        <h1 className="text-2xl font-bold text-moss-700">Collection not found</h1>
        <p className="mt-3 text-stone-800">
          {e instanceof ApiClientError && e.status === 404 ? `${e.message} It may be private: only its owner can see it.` : e instanceof Error ? e.message : "Something went wrong."}
        </p>
      </section>
    );
  }
  return <CollectionView c={c} bundle={bundle} />;
}

function CollectionView({ c, bundle }: { c: CollectionDetail; bundle: CollectionPageProps["bundle"] }) {
  const latest = c.shownRevision === c.revision;
  const url = `${window.location.origin}${paths.collection.href(c.code, c.shownRevision)}`;
  const cite: CollectionCitationInput = useMemo(
    () => ({ name: c.name, description: c.description, owner: c.owner.displayName, code: c.code, revision: c.shownRevision, networks: c.members.length, year: new Date(c.updatedAt).getUTCFullYear(), url }),
    [c, url],
  );
  const published = c.members.filter((m) => m.state === "published").map((m) => m.ref);
  const withdrawn = c.members.length - published.length;
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-stone-700">
        <Link className="text-moss-700 underline" to={paths.collections.href()}>
          Collections
        </Link>{" "}
        / <span aria-current="page">{c.code}</span>
      </nav>
      <header className="space-y-2">
        <h1 className="text-2xl font-bold break-words text-moss-700">{c.name}</h1>
        <p className="text-stone-700">
          <span className="font-mono">{c.code}</span> · revision {c.shownRevision} · {c.members.length} network{c.members.length === 1 ? "" : "s"}
          {withdrawn ? ` (${withdrawn} withdrawn)` : ""} · <span className="font-semibold">{c.visibility === "public" ? "Public" : "Private: only you can see it"}</span> · saved by{" "}
          {c.owner.displayName} on {dateOf(c.createdAt)}
        </p>
        {!latest && (
          <Alert tone="info">
            This is revision {c.shownRevision}, as it was cited. The collection is now at revision {c.revision}:{" "}
            <Link className="font-semibold underline" to={paths.collection.href(c.code)}>
              see the current networks
            </Link>
            .
          </Alert>
        )}
        {c.description && <p className="max-w-3xl whitespace-pre-line text-stone-900">{c.description}</p>}
        {c.savedFrom?.kind === "filter" && (
          <p className="text-sm text-stone-700">
            Saved from the catalogue filter{" "}
            <Link className="font-mono text-moss-700 underline" to={`${paths.catalogue.href()}?${new URLSearchParams(c.savedFrom.filter).toString()}`}>
              {new URLSearchParams(c.savedFrom.filter).toString() || "(everything)"}
            </Link>
            , frozen to the versions it matched then.
          </p>
        )}
      </header>

      <section aria-labelledby="use-h" className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h2 id="use-h" className="text-lg font-bold text-moss-700">
          Use this set
        </h2>
        <p className="text-sm text-stone-800">
          Stable link to exactly these networks (revision {c.shownRevision}):{" "}
          <a className="font-mono break-all text-moss-700 underline" href={url} data-testid="stable-link">
            {url}
          </a>
        </p>
        <div className="flex flex-wrap items-center gap-3">
          {published.length > 0 && bundle(published, `Bundle ${published.length === c.members.length ? "this collection" : "its published networks"}`)}
          {c.members.length > 0 && (
            <Link className={linkLook} to={paths.compare.href(undefined, { collection: c.code, revision: latest ? undefined : c.shownRevision })}>
              Compare these networks
            </Link>
          )}
        </div>
        {withdrawn > 0 && <p className="text-sm text-stone-700">Withdrawn networks stay listed below with the reason, but their data are no longer given out: bundles hold the {published.length} others.</p>}
      </section>

      <CitationPanel heading="Cite this collection" text={formatCollectionCitation(cite)} bibtex={collectionToBibTeX(cite)} ris={collectionToRIS(cite)} fileBase={`${c.code}-r${c.shownRevision}`}>
        <p className="mt-2 text-sm text-stone-700">Please cite the datasets it holds too: a bundle&apos;s CITATIONS.bib lists each of them with its source publication.</p>
      </CitationPanel>

      <Members c={c} editable={c.isOwner && latest} />
      {c.isOwner && latest && <OwnerPanel c={c} />}
    </div>
  );
}

function Members({ c, editable }: { c: CollectionDetail; editable: boolean }) {
  const remove = useRemoveMember();
  return (
    <section aria-labelledby="members-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="members-h" className="text-lg font-bold text-moss-700">
        Networks ({c.members.length})
      </h2>
      {remove.error && <Alert tone="error">{remove.error.message}</Alert>}
      {c.members.length === 0 ? (
        <p className="mt-2 text-stone-700">No networks in this revision.</p>
      ) : (
        <div className="mt-2 overflow-x-auto">
          <table className="min-w-full text-left text-sm">
            <caption className="sr-only">Networks of {c.code}, revision {c.shownRevision}</caption>
            <thead className="border-b border-stone-300 text-stone-700">
              <tr>
                <th scope="col" className="px-2 py-1">
                  Network
                </th>
                <th scope="col" className="px-2 py-1">
                  Name and dataset
                </th>
                <th scope="col" className="px-2 py-1">
                  Interaction
                </th>
                <th scope="col" className="px-2 py-1 text-right">
                  S
                </th>
                <th scope="col" className="px-2 py-1 text-right">
                  L
                </th>
                <th scope="col" className="px-2 py-1">
                  Status
                </th>
                {editable && (
                  <th scope="col" className="px-2 py-1">
                    <span className="sr-only">Remove</span>
                  </th>
                )}
              </tr>
            </thead>
            <tbody>
              {c.members.map((m) => (
                <MemberRow key={m.ref} m={m} editable={editable} busy={remove.isPending} onRemove={() => remove.mutate({ code: c.code, ref: m.ref })} />
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

function MemberRow({ m, editable, busy, onRemove }: { m: CollectionMemberView; editable: boolean; busy: boolean; onRemove: () => void }) {
  const gone = m.state === "withdrawn";
  return (
    <tr className={`border-b border-stone-100 align-top last:border-0 ${gone ? "bg-stone-100 text-stone-600" : ""}`} data-testid="collection-member">
      <td className="px-2 py-1.5 font-mono whitespace-nowrap">
        {gone ? (
          <Link className="text-stone-700 underline" to={paths.dataset.href(m.accession)}>
            {m.ref}
          </Link>
        ) : (
          <Link className="font-semibold text-moss-700 underline" to={paths.networkView.href(m.accession, m.version, m.position)}>
            {m.ref}
          </Link>
        )}
      </td>
      <td className="px-2 py-1.5">
        <span className={gone ? "line-through" : "text-stone-900"}>{m.name}</span>
        <span className="block text-xs text-stone-600">{m.datasetTitle}</span>
      </td>
      <td className="px-2 py-1.5">{(m.interactionType ?? "—").replace(/-/g, " ")}</td>
      <td className="px-2 py-1.5 text-right tabular-nums">{m.nNodes}</td>
      <td className="px-2 py-1.5 text-right tabular-nums">{m.nLinks}</td>
      <td className="px-2 py-1.5">
        {gone ? (
          <span>
            <span className="font-semibold text-red-800">Withdrawn</span> on {dateOf(m.withdrawal!.at)}
            {m.withdrawal!.reason && <span className="block text-xs">Reason: {m.withdrawal!.reason}</span>}
          </span>
        ) : (
          <span>
            Published
            {m.newerVersion && (
              <span className="block text-xs text-stone-700">
                Newer: <Link className="underline" to={paths.datasetVersion.href(m.accession, m.newerVersion)}>version {m.newerVersion}</Link>
              </span>
            )}
          </span>
        )}
      </td>
      {editable && (
        <td className="px-2 py-1.5">
          <button type="button" className="text-sm font-semibold text-red-800 underline disabled:opacity-50" disabled={busy} onClick={onRemove} aria-label={`Remove ${m.ref} from the collection`}>
            Remove
          </button>
        </td>
      )}
    </tr>
  );
}

function OwnerPanel({ c }: { c: CollectionDetail }) {
  const update = useUpdateCollection();
  const add = useAddMembers();
  const del = useDeleteCollection();
  const navigate = useNavigate();
  const [refs, setRefs] = useState("");
  const [confirm, setConfirm] = useState(false);
  return (
    <section aria-labelledby="manage-h" className="space-y-4 rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="manage-h" className="text-lg font-bold text-moss-700">
        Manage this collection
      </h2>
      <form
        key={`${c.name}|${c.description}|${c.visibility}`}
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          update.mutate({ code: c.code, patch: { name: String(f.get("name") ?? ""), description: String(f.get("description") ?? ""), visibility: f.get("visibility") === "public" ? "public" : "private" } });
        }}
      >
        <label className="block text-sm font-semibold text-stone-800">
          Name
          <input name="name" defaultValue={c.name} required maxLength={200} className="mt-1 block w-full rounded border border-stone-400 px-2 py-1 font-normal" />
        </label>
        <label className="block text-sm font-semibold text-stone-800">
          Description
          <textarea name="description" defaultValue={c.description} rows={3} maxLength={5000} className="mt-1 block w-full rounded border border-stone-400 px-2 py-1 font-normal" />
        </label>
        <fieldset className="text-sm">
          <legend className="font-semibold text-stone-800">Who can see it</legend>
          <label className="mr-4 inline-flex items-center gap-1.5">
            <input type="radio" name="visibility" value="private" defaultChecked={c.visibility === "private"} className="accent-moss-700" /> Only me
          </label>
          <label className="inline-flex items-center gap-1.5">
            <input type="radio" name="visibility" value="public" defaultChecked={c.visibility === "public"} className="accent-moss-700" /> Anyone with the link
          </label>
        </fieldset>
        <Button className="px-3 py-1.5 text-sm" busy={update.isPending}>
          Save changes
        </Button>
        {update.error && <Alert tone="error">{update.error.message}</Alert>}
        {update.isSuccess && <p role="status" className="text-sm text-moss-700">Saved.</p>}
      </form>
      <form
        className="space-y-2 border-t border-stone-200 pt-3"
        onSubmit={(e) => {
          e.preventDefault();
          const list = refs.split(/[\s,;]+/).map((r) => r.trim()).filter(Boolean);
          if (list.length) add.mutate({ code: c.code, refs: list }, { onSuccess: () => setRefs("") });
        }}
      >
        <label className="block text-sm font-semibold text-stone-800">
          Add networks (references such as TB-000042/v2/3, one per line or separated by commas)
          <textarea value={refs} onChange={(e) => setRefs(e.target.value)} rows={2} className="mt-1 block w-full rounded border border-stone-400 px-2 py-1 font-mono font-normal" />
        </label>
        <p className="text-xs text-stone-600">Or select networks in the catalogue and choose “Add to collection”. Adding or removing networks makes a new revision; earlier revisions stay listed for citations.</p>
        <Button className="px-3 py-1.5 text-sm" variant="secondary" busy={add.isPending}>
          Add to the collection
        </Button>
        {add.error && (
          <Alert tone="error">
            {add.error.message}
            {add.error instanceof ApiClientError && add.error.details?.length ? ` ${add.error.details.map((d) => d.message).join(" ")}` : ""}
          </Alert>
        )}
      </form>
      <div className="border-t border-stone-200 pt-3">
        {!confirm ? (
          <button type="button" className="text-sm font-semibold text-red-800 underline" onClick={() => setConfirm(true)}>
            Delete this collection…
          </button>
        ) : (
          <div role="alert" className="space-y-2 rounded border border-red-300 bg-red-50 p-3 text-sm text-red-900">
            <p>Delete {c.code} and every revision of it? Links and citations to it will stop working. The networks themselves stay in the catalogue.</p>
            <div className="flex gap-2">
              <Button type="button" className="bg-red-800 px-3 py-1.5 text-sm hover:bg-red-700" busy={del.isPending} onClick={() => del.mutate(c.code, { onSuccess: () => navigate(paths.collections.href()) })}>
                Delete it
              </Button>
              <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" onClick={() => setConfirm(false)}>
                Keep it
              </Button>
            </div>
          </div>
        )}
      </div>
    </section>
  );
}
