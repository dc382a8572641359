/**
 * The frame of every chart: a <figure> with a visible caption and a text alternative — a table of the
 * plotted values behind a disclosure (screen readers and keyboard users reach it; sighted users may open it).
 */
import { useRef, useState, type ReactNode } from "react";
import { downloadBlob, downloadText } from "../../lib/download";
import { figureSvg, serializeSvg, svgSize, svgToPng, type SvgFile } from "./image-export";

export interface DataTableSpec {
  caption: string;
  columns: string[];
  rows: Array<Array<string | number>>;
  /** Rows beyond this are summarised, not listed. */
  maxRows?: number;
}

/**
 * Download buttons for the chart inside `body`: an SVG file and a PNG (twice the drawn size), each with
 * the chart's title and caption. A chart drawn on a canvas gives its SVG through `svgOf`.
 * `name` is the file name without extension.
 */
function ImageDownloads({ body, caption, name, title, svgOf }: { body: React.RefObject<HTMLDivElement | null>; caption: React.RefObject<HTMLElement | null>; name: string; title: string; svgOf?: () => SvgFile | null }) {
  const [error, setError] = useState<string | null>(null);
  const file = (): SvgFile | null => {
    // a canvas chart gives its own SVG (null while it is still being drawn); never another SVG of the figure
    const el = body.current;
    const svg = svgOf ? null : ((el?.querySelector("svg[role='img']") ?? el?.querySelector("svg")) as SVGSVGElement | null);
    const chart = svgOf ? svgOf() : svg ? { text: serializeSvg(svg), ...svgSize(svg) } : null;
    return chart ? figureSvg(chart, title, caption.current?.textContent ?? "") : null;
  };
  const png = async () => {
    setError(null);
    const f = file();
    if (!f) return;
    try {
      downloadBlob(`${name}.png`, await svgToPng(f));
    } catch (e) {
      setError((e as Error).message);
    }
  };
  const svg = () => {
    const f = file();
    if (f) downloadText(`${name}.svg`, "image/svg+xml", f.text);
  };
  const btn = "rounded border border-stone-300 bg-white px-2 py-0.5 text-xs font-semibold text-moss-700 hover:bg-moss-50";
  return (
    <span className="flex flex-wrap items-center gap-1.5" role="group" aria-label={`Download ${title} as an image`}>
      <span className="text-xs text-stone-600" aria-hidden="true">
        Download
      </span>
      <button type="button" className={btn} onClick={svg}>
        SVG
      </button>
      <button type="button" className={btn} onClick={() => void png()}>
        PNG
      </button>
      {error && <span role="alert" className="text-xs text-red-800">{error}</span>}
    </span>
  );
}

export function ChartFigure({
  title,
  caption,
  table,
  children,
  id,
  download,
  svgOf,
}: {
  title: string;
  caption: ReactNode;
  table?: DataTableSpec;
  children: ReactNode;
  id?: string;
  /** File name (no extension) of the chart's image downloads; none without it. */
  download?: string;
  /** A chart drawn on a canvas: its SVG for the downloads. */
  svgOf?: () => SvgFile | null;
}) {
  const max = table?.maxRows ?? 200;
  const body = useRef<HTMLDivElement>(null);
  const captionRef = useRef<HTMLElement>(null);
  return (
    <figure className="rounded-lg bg-white p-4 ring-1 ring-stone-200" aria-labelledby={id ? `${id}-title` : undefined}>
      <div className="mb-2 flex flex-wrap items-start justify-between gap-2">
        <h3 id={id ? `${id}-title` : undefined} className="font-bold text-moss-700">
          {title}
        </h3>
        {download && <ImageDownloads body={body} caption={captionRef} name={download} title={title} svgOf={svgOf} />}
      </div>
      <div ref={body}>{children}</div>
      <figcaption ref={captionRef} className="mt-2 text-sm text-stone-700">
        {caption}
      </figcaption>
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
