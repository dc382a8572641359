/** The dataset's audit history, newest first (shown to curators). */
import type { AuditEntry } from "@shared/types/network-view";
import { SectionCard } from "./section-card";

export function HistorySection({ entries, loading, error }: { entries: AuditEntry[] | undefined; loading: boolean; error: string | null }) {
  return (
    <SectionCard
      id="history-h"
      heading={
        <>
          Audit history <span className="text-sm font-normal text-stone-700">(visible to curators)</span>
        </>
      }
    >
      {loading && <p className="mt-2 text-sm text-stone-700">Loading…</p>}
      {error && <p className="mt-2 text-sm text-red-800">{error}</p>}
      {entries && entries.length === 0 && <p className="mt-2 text-sm text-stone-700">No recorded changes.</p>}
      {entries && entries.length > 0 && (
        <table className="mt-2 min-w-full text-left text-sm">
          <caption className="sr-only">Audit history, newest first</caption>
          <thead>
            <tr className="border-b border-stone-300">
              <th scope="col" className="px-2 py-1">When (UTC)</th>
              <th scope="col" className="px-2 py-1">Who</th>
              <th scope="col" className="px-2 py-1">What</th>
              <th scope="col" className="px-2 py-1">Details</th>
            </tr>
          </thead>
          <tbody>
            {entries.map((e) => (
              <tr key={e.id} className="border-b border-stone-100 align-top">
                <td className="px-2 py-1 whitespace-nowrap">{e.at.slice(0, 16).replace("T", " ")}</td>
                <td className="px-2 py-1">{e.actor?.displayName ?? "system"}</td>
                <td className="px-2 py-1 font-mono text-xs">{e.action}</td>
                <td className="px-2 py-1 font-mono text-xs break-all">{Object.keys(e.details).length ? JSON.stringify(e.details) : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </SectionCard>
  );
}
