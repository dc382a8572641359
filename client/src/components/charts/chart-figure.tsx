/**
 * The frame of every chart: a <figure> with a visible caption and a text alternative — a table of the
 * plotted values behind a disclosure (screen readers and keyboard users reach it; sighted users may open it).
 */
import type { ReactNode } from "react";

export interface DataTableSpec {
  caption: string;
  columns: string[];
  rows: Array<Array<string | number>>;
  /** Rows beyond this are summarised, not listed. */
  maxRows?: number;
}

export function ChartFigure({ title, caption, table, children, id }: { title: string; caption: ReactNode; table?: DataTableSpec; children: ReactNode; id?: string }) {
  const max = table?.maxRows ?? 200;
  return (
    <figure className="rounded-lg bg-white p-4 ring-1 ring-stone-200" aria-labelledby={id ? `${id}-title` : undefined}>
      <h3 id={id ? `${id}-title` : undefined} className="mb-2 font-bold text-moss-700">
        {title}
      </h3>
      {children}
      <figcaption className="mt-2 text-sm text-stone-700">{caption}</figcaption>
      {table && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-semibold text-moss-700">Data as a table</summary>
          <div className="mt-2 max-h-72 overflow-auto">
            <table className="min-w-full text-left text-xs">
              <caption className="sr-only">{table.caption}</caption>
              <thead>
                <tr>
                  {table.columns.map((c) => (
                    <th key={c} scope="col" className="border-b border-stone-300 px-2 py-1 font-semibold">
                      {c}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {table.rows.slice(0, max).map((r, i) => (
                  <tr key={i} className="odd:bg-stone-50">
                    {r.map((v, j) => (
                      <td key={j} className="px-2 py-0.5 tabular-nums">
                        {v}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
            {table.rows.length > max && <p className="mt-1 text-stone-600">…and {table.rows.length - max} more rows (download the data for all).</p>}
          </div>
        </details>
      )}
    </figure>
  );
}
