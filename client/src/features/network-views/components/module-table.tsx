import type { NetworkView } from "@shared/types/network-view";
import { moduleBand, moduleColour } from "@shared/plots/palette";

export function ModuleTable({ view }: { view: NetworkView }) {
  if (!view.modules.length) return null;
  const bip = view.kind === "bipartite";
  const total = view.modules.reduce((s, m) => s + m.linksInside, 0);
  return (
    <section aria-labelledby="modules-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="modules-h" className="text-lg font-bold text-moss-700">
        Modules
      </h2>
      <div className="mt-2 max-h-96 overflow-auto">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Modules of the best partition with their sizes and the links inside them</caption>
          <thead className="sticky top-0 bg-white">
            <tr className="border-b border-stone-300">
              <th scope="col" className="px-2 py-1">Module</th>
              <th scope="col" className="px-2 py-1 text-right">{bip ? (view.metadata.rowLevel ?? "Rows") : "Nodes"}</th>
              {bip && <th scope="col" className="px-2 py-1 text-right">{view.metadata.colLevel ?? "Columns"}</th>}
              <th scope="col" className="px-2 py-1 text-right">Links inside</th>
              {view.weighted && <th scope="col" className="px-2 py-1 text-right">Weight inside</th>}
            </tr>
          </thead>
          <tbody>
            {view.modules.map((m) => (
              <tr key={m.module} className="odd:bg-stone-50">
                <td className="px-2 py-1">
                  <span className="inline-flex items-center gap-1.5">
                    <svg width="18" height="14" aria-hidden="true">
                      <rect width="18" height="14" fill={moduleBand(m.module)} />
                      <rect x="5" y="3" width="8" height="8" fill={moduleColour(m.module)} />
                    </svg>
                    {m.module + 1}
                  </span>
                </td>
                <td className="px-2 py-1 text-right tabular-nums">{m.rows}</td>
                {bip && <td className="px-2 py-1 text-right tabular-nums">{m.cols}</td>}
                <td className="px-2 py-1 text-right tabular-nums">{m.linksInside}</td>
                {view.weighted && <td className="px-2 py-1 text-right tabular-nums">{Number(m.weightInside.toFixed(3))}</td>}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-sm text-stone-700">
        {total} of {view.nLinks} links ({view.nLinks ? ((100 * total) / view.nLinks).toFixed(1) : "0"} %) lie inside modules.
      </p>
    </section>
  );
}
