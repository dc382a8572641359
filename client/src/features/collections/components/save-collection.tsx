/**
 * In the catalogue's selection bar: "Save as collection" (the selection, or everything matching the
 * filters) and "Add to collection" (the selection, into one of the user's collections). Visitors are asked
 * to sign in.
 */
import { useId, useState } from "react";
import { Link, useNavigate } from "react-router-dom";
import { Alert, Button } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { ApiClientError } from "../../../lib/api-client";
import { useMyCollections } from "../api/get-collections";
import { useAddMembers, useCreateCollection } from "../api/mutations";

export interface SaveCollectionProps {
  signedIn: boolean;
  selected: string[];
  filter: URLSearchParams;
  total: number;
}

const toggleLook = "text-sm font-semibold text-moss-700 underline";

function problem(e: unknown): string {
  if (!(e instanceof Error)) return "Something went wrong.";
  const details = e instanceof ApiClientError && e.details?.length ? ` ${e.details.map((d) => d.message).join(" ")}` : "";
  return `${e.message}${details}`;
}

export function SaveCollection({ signedIn, selected, filter, total }: SaveCollectionProps) {
  const [open, setOpen] = useState<"save" | "add" | null>(null);
  if (!signedIn) {
    return (
      <Link className={toggleLook} to={paths.signIn.href(`${paths.catalogue.href()}?${filter.toString()}`)}>
        Sign in to save as a collection
      </Link>
    );
  }
  return (
    <div className="flex w-full flex-wrap items-start gap-3">
      <button type="button" className={toggleLook} aria-expanded={open === "save"} onClick={() => setOpen(open === "save" ? null : "save")}>
        Save as collection…
      </button>
      {selected.length > 0 && (
        <button type="button" className={toggleLook} aria-expanded={open === "add"} onClick={() => setOpen(open === "add" ? null : "add")}>
          Add to collection…
        </button>
      )}
      {open === "save" && <SaveForm selected={selected} filter={filter} total={total} />}
      {open === "add" && <AddForm selected={selected} />}
    </div>
  );
}

function SaveForm({ selected, filter, total }: Omit<SaveCollectionProps, "signedIn">) {
  const id = useId();
  const create = useCreateCollection();
  const navigate = useNavigate();
  const [from, setFrom] = useState<"selection" | "filter">(selected.length ? "selection" : "filter");
  return (
    <form
      aria-label="Save as collection"
      className="w-full max-w-xl space-y-2 rounded border border-stone-300 bg-white p-3 text-sm text-stone-800"
      onSubmit={(e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const base = { name: String(f.get("name") ?? ""), description: String(f.get("description") ?? ""), visibility: f.get("visibility") === "public" ? ("public" as const) : ("private" as const) };
        create.mutate(from === "selection" ? { ...base, refs: selected } : { ...base, filter: Object.fromEntries(filter.entries()) }, { onSuccess: (c) => c && navigate(paths.collection.href(c.code)) });
      }}
    >
      <label className="block font-semibold" htmlFor={`${id}-name`}>
        Name
      </label>
      <input id={`${id}-name`} name="name" required maxLength={200} placeholder="e.g. Heath webs for the 2026 meta-analysis" className="block w-full rounded border border-stone-400 px-2 py-1" />
      <label className="block font-semibold" htmlFor={`${id}-description`}>
        Description <span className="font-normal text-stone-600">(optional)</span>
      </label>
      <textarea id={`${id}-description`} name="description" rows={2} maxLength={5000} className="block w-full rounded border border-stone-400 px-2 py-1" />
      <fieldset>
        <legend className="font-semibold">Networks</legend>
        <label className="mr-4 inline-flex items-center gap-1.5">
          <input type="radio" name="from" checked={from === "selection"} disabled={!selected.length} onChange={() => setFrom("selection")} className="accent-moss-700" /> The {selected.length} selected
        </label>
        <label className="inline-flex items-center gap-1.5">
          <input type="radio" name="from" checked={from === "filter"} onChange={() => setFrom("filter")} className="accent-moss-700" /> All {total.toLocaleString("en")} matching the filters
        </label>
      </fieldset>
      <fieldset>
        <legend className="font-semibold">Who can see it</legend>
        <label className="mr-4 inline-flex items-center gap-1.5">
          <input type="radio" name="visibility" value="private" defaultChecked className="accent-moss-700" /> Only me
        </label>
        <label className="inline-flex items-center gap-1.5">
          <input type="radio" name="visibility" value="public" className="accent-moss-700" /> Anyone with the link
        </label>
      </fieldset>
      <p className="text-xs text-stone-600">The collection keeps the exact versions of these networks: later versions or new matches never change it.</p>
      <Button className="px-3 py-1.5 text-sm" busy={create.isPending}>
        Save collection
      </Button>
      {create.error && <Alert tone="error">{problem(create.error)}</Alert>}
    </form>
  );
}

function AddForm({ selected }: { selected: string[] }) {
  const mine = useMyCollections();
  const add = useAddMembers();
  const [code, setCode] = useState("");
  const list = mine.data?.data ?? [];
  return (
    <form
      aria-label="Add to collection"
      className="w-full max-w-xl space-y-2 rounded border border-stone-300 bg-white p-3 text-sm text-stone-800"
      onSubmit={(e) => {
        e.preventDefault();
        if (code) add.mutate({ code, refs: selected });
      }}
    >
      {mine.isPending ? (
        <p>Loading your collections…</p>
      ) : list.length === 0 ? (
        <p>You have no collections yet: save one first.</p>
      ) : (
        <>
          <label className="block font-semibold">
            Add the {selected.length} selected network{selected.length === 1 ? "" : "s"} to
            <select value={code} onChange={(e) => setCode(e.target.value)} className="mt-1 block w-full rounded border border-stone-400 bg-white px-2 py-1 font-normal">
              <option value="">Choose a collection…</option>
              {list.map((c) => (
                <option key={c.code} value={c.code}>
                  {c.name} ({c.code}, {c.memberCount} networks)
                </option>
              ))}
            </select>
          </label>
          <Button className="px-3 py-1.5 text-sm" busy={add.isPending} disabled={!code}>
            Add
          </Button>
        </>
      )}
      {add.error && <Alert tone="error">{problem(add.error)}</Alert>}
      {add.data ? (
        <p role="status" className="text-moss-700">
          Added: <Link className="font-semibold underline" to={paths.collection.href(add.data.code)}>{add.data.name}</Link> now holds {add.data.memberCount} networks (revision {add.data.revision}).
        </p>
      ) : null}
    </form>
  );
}
