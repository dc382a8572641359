/** The network's metrics runs, newest first: when, engine version, settings, null models, status (errors for curators and admins). */
import type { NetworkView } from "@shared/types/network-view";
import { nullLabel } from "../../../components/figures/significance";
import { fmt } from "../utils/format";

const when = (iso: string | null) => (iso ? `${iso.slice(0, 16).replace("T", " ")} UTC` : "—");

export function RunHistory({ view }: { view: NetworkView }) {
  const runs = view.runHistory ?? [];
  return (
    <section aria-labelledby="runs-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="runs-h" className="text-lg font-bold text-moss-700">
        Run history
      </h2>
      {runs.length === 0 ? (
        <p className="mt-2 text-stone-700">No metrics run yet.</p>
      ) : (
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="sr-only">Every metrics run of {view.ref}, newest first</caption>
            <thead>
              <tr className="border-b border-stone-300 text-left text-stone-700">
                <th scope="col" className="py-1 pr-3">Run</th>
                <th scope="col" className="py-1 pr-3">Started</th>
                <th scope="col" className="py-1 pr-3">Status</th>
                <th scope="col" className="py-1 pr-3">Engine</th>
                <th scope="col" className="py-1 pr-3">Settings</th>
                <th scope="col" className="py-1 pr-3">Null models computed</th>
                <th scope="col" className="py-1 text-right">Q</th>
              </tr>
            </thead>
            <tbody>
              {runs.map((r) => (
                <tr key={r.runId} className={`border-b border-stone-200 align-top ${r.shown ? "bg-moss-50" : ""}`}>
                  <td className="py-1 pr-3 font-mono">
                    {r.runId}
                    {r.shown && <span className="ml-1 font-sans text-xs text-moss-800">(shown)</span>}
                  </td>
                  <td className="py-1 pr-3">{when(r.createdAt)}</td>
                  <td className="py-1 pr-3">
                    {r.status}
                    {r.status === "failed" && (
                      <span className="block text-xs text-red-900">
                        {r.errorKind === "configuration" ? "a setting does not fit this network (not retried)" : "the computation failed"}
                        {r.error ? `: ${r.error}` : ""}
                      </span>
                    )}
                  </td>
                  <td className="py-1 pr-3 font-mono text-xs">{r.engineVersion ?? "—"}</td>
                  <td className="py-1 pr-3 text-xs">
                    {r.settings.objective} objective, {r.settings.restarts} restarts, {r.settings.nulls} nulls per model, seed {r.settings.seed};{" "}
                    {r.settings.nullModels === "standard" ? "standard null models" : `null models ${r.settings.nullModels.join(", ")}`}
                  </td>
                  <td className="py-1 pr-3 text-xs">{r.nullModelsComputed.length ? r.nullModelsComputed.map(nullLabel).join("; ") : "—"}</td>
                  <td className="py-1 text-right font-mono tabular-nums">{fmt(r.Q, 4)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
