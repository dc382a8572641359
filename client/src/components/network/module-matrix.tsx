/**
 * The interaction matrix ordered by module, on a canvas. Each module is a band in its own colour: its
 * block (its row nodes × its column nodes) is shaded pale, its links are drawn in the module's hue, a strip
 * of that hue runs along its rows and its columns, and links between modules are neutral grey
 * (shared/plots/palette.ts). A legend names each module with its size and the links inside it, and the
 * share of links inside modules is shown above the picture.
 *
 * The image is built in a Web Worker (module-matrix.worker.ts, shared/plots/matrix-image.ts) and painted
 * once; `data-rendered="true"` marks the finished drawing (the benchmark waits for it). Row and column
 * labels are drawn when cells are large enough to read them.
 *
 * Used by the network view and the curators' review page: it needs only the cells, labels and partition.
 */
import { useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import type { NetworkMetadata } from "@shared/types/dataset";
import type { MatrixImage } from "@shared/plots/matrix-image";
import { BETWEEN_MODULES, moduleBand, moduleColour, NO_PARTITION } from "@shared/plots/palette";
import { ChartFigure } from "../charts/chart-figure";
import { escapeXml, type SvgFile } from "../charts/image-export";
import { chartTheme } from "../charts/theme";

const MAX_W = 960;
const MAX_H = 720;
/** Width of the module strips along the rows and columns (pixels), and the gap to the matrix. */
const STRIP = 7;
const GAP = 2;
const LABEL_SIZE = 11;
const FRAME = "#d6d3d1"; // stone-300
/** Modules named one by one in the legend; the rest are summed up. */
const LEGEND_MAX = 24;
let nextId = 1;

export interface ModuleMatrixData {
  kind: "bipartite" | "unipartite";
  directed: boolean;
  nLinks: number;
  rowLabels: string[];
  colLabels: string[];
  cells: { ptr: number[]; idx: number[]; w: number[] | null };
  rowModules: number[] | null;
  colModules: number[] | null;
  metadata: Pick<NetworkMetadata, "rowLevel" | "colLevel">;
}

/** What the rows and columns are, in the words of the network's metadata ("row nodes (plants)"). */
export function nodeSides(view: Pick<ModuleMatrixData, "kind" | "metadata">): { rows: string; cols: string } {
  if (view.kind !== "bipartite") return { rows: "nodes", cols: "nodes" };
  return { rows: view.metadata.rowLevel ?? "row nodes", cols: view.metadata.colLevel ?? "column nodes" };
}

interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
  fill: string;
}
interface Label {
  x: number;
  y: number;
  text: string;
}

/**
 * The module strips (a band of the module's hue along its rows, left, and its columns, top) and the node
 * labels (cut to 20 characters; column labels leaning 60°), in the drawing's pixel coordinates.
 */
function decorations(img: MatrixImage, view: ModuleMatrixData, g: { left: number; top: number; strip: number; labelled: boolean }): { strips: Rect[]; rowLabels: Label[]; colLabels: Label[] } {
  const nRows = view.rowLabels.length;
  const nCols = view.colLabels.length;
  const sx = img.width / nCols;
  const sy = img.height / nRows;
  const strips: Rect[] = [];
  for (const b of img.blocks) {
    const fill = moduleColour(b.module);
    if (b.rowEnd > b.rowStart) {
      const y0 = g.top + 1 + Math.floor(b.rowStart * sy);
      strips.push({ x: g.left - STRIP - GAP + 1, y: y0, w: STRIP, h: Math.max(1, g.top + 1 + Math.ceil(b.rowEnd * sy) - y0), fill });
    }
    if (b.colEnd > b.colStart) {
      const x0 = g.left + 1 + Math.floor(b.colStart * sx);
      strips.push({ x: x0, y: g.top - STRIP - GAP + 1, w: Math.max(1, g.left + 1 + Math.ceil(b.colEnd * sx) - x0), h: STRIP, fill });
    }
  }
  if (!g.labelled) return { strips, rowLabels: [], colLabels: [] };
  const rowLabels = Array.from(img.rowOrder, (orig, pos) => ({ x: g.left - g.strip - 4, y: g.top + 1 + (pos + 0.5) * img.cell, text: view.rowLabels[orig].slice(0, 20) }));
  const colLabels = Array.from(img.colOrder, (orig, pos) => ({ x: g.left + 1 + (pos + 0.5) * img.cell, y: g.top - g.strip - 4, text: view.colLabels[orig].slice(0, 20) }));
  return { strips, rowLabels, colLabels };
}

/** `id` prefixes the figure's element ids: give each matrix on a page its own. */
export function ModuleMatrix({ view, title = "Interaction matrix ordered by module", actions, id = "matrix", download }: { view: ModuleMatrixData; title?: string; actions?: ReactNode; id?: string; download?: string }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [img, setImg] = useState<MatrixImage | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [hover, setHover] = useState<string>("");
  const sides = nodeSides(view);
  const square = view.kind !== "bipartite";
  const nRows = view.rowLabels.length;
  const nCols = view.colLabels.length;
  const partitioned = !!(view.rowModules && view.colModules);

  useEffect(() => {
    const id = nextId++;
    const worker = new Worker(new URL("./module-matrix.worker.ts", import.meta.url), { type: "module" });
    worker.onmessage = (e: MessageEvent<MatrixImage & { id: number }>) => {
      if (e.data.id === id) setImg(e.data);
      worker.terminate();
    };
    worker.onerror = (e) => {
      setError(`The matrix could not be drawn: ${e.message}`);
      worker.terminate();
    };
    worker.postMessage({
      id,
      nRows,
      nCols,
      ptr: Int32Array.from(view.cells.ptr),
      idx: Int32Array.from(view.cells.idx),
      rowModules: view.rowModules ? Int32Array.from(view.rowModules) : null,
      colModules: view.colModules ? Int32Array.from(view.colModules) : null,
      square,
      maxW: MAX_W,
      maxH: MAX_H,
    });
    return () => worker.terminate();
  }, [view, nRows, nCols, square]);

  const labelled = img !== null && img.cell >= 10;
  const strip = partitioned ? STRIP + GAP : 0;
  // margins fit the longest (cut to 20 characters) row label and the rotated column labels, plus the strips
  const { left, top, right } = useMemo(() => {
    if (!labelled) return { left: strip, top: strip, right: 0 };
    const ctx = document.createElement("canvas").getContext("2d");
    if (!ctx) return { left: 130 + strip, top: 110 + strip, right: 60 };
    ctx.font = `${LABEL_SIZE}px ${chartTheme.font}`;
    const widest = (labels: string[]) => labels.reduce((w, l) => Math.max(w, ctx.measureText(l.slice(0, 20)).width), 0);
    const colWidest = widest(view.colLabels);
    // the last column's label leans right past the matrix
    return { left: Math.ceil(widest(view.rowLabels)) + 10 + strip, top: Math.ceil(colWidest * Math.sin(Math.PI / 3)) + 12 + strip, right: Math.ceil(colWidest * Math.cos(Math.PI / 3)) };
  }, [labelled, view, strip]);

  // What is drawn around the matrix image (module strips, labels), shared by the canvas and the SVG file.
  const deco = useMemo(() => (img ? decorations(img, view, { left, top, strip, labelled }) : null), [img, view, left, top, strip, labelled]);
  const size = useMemo(() => (img ? { width: img.width + left + 2 + right, height: img.height + top + 2 } : null), [img, left, top, right]);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!img || !canvas || !deco || !size) return;
    canvas.width = size.width;
    canvas.height = size.height;
    const ctx = canvas.getContext("2d")!;
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.putImageData(new ImageData(new Uint8ClampedArray(img.pixels), img.width, img.height), left + 1, top + 1);
    ctx.strokeStyle = FRAME;
    ctx.lineWidth = 1;
    ctx.strokeRect(left + 0.5, top + 0.5, img.width + 1, img.height + 1);
    for (const r of deco.strips) {
      ctx.fillStyle = r.fill;
      ctx.fillRect(r.x, r.y, r.w, r.h);
    }
    ctx.fillStyle = chartTheme.text;
    ctx.font = `${LABEL_SIZE}px ${chartTheme.font}`;
    ctx.textBaseline = "middle";
    ctx.textAlign = "right";
    for (const l of deco.rowLabels) ctx.fillText(l.text, l.x, l.y);
    ctx.textAlign = "left";
    for (const l of deco.colLabels) {
      ctx.save();
      ctx.translate(l.x, l.y);
      ctx.rotate(-Math.PI / 3);
      ctx.fillText(l.text, 0, 0);
      ctx.restore();
    }
    canvas.dataset.rendered = "true";
  }, [img, deco, size, left, top]);

  /** The same drawing as an SVG file: the matrix's pixels as an embedded image, strips and labels as shapes and text. */
  const svgOf = (): SvgFile | null => {
    if (!img || !deco || !size) return null;
    const c = document.createElement("canvas");
    c.width = img.width;
    c.height = img.height;
    c.getContext("2d")!.putImageData(new ImageData(new Uint8ClampedArray(img.pixels), img.width, img.height), 0, 0);
    const font = escapeXml(chartTheme.font);
    const text = [
      `<?xml version="1.0" encoding="UTF-8"?>`,
      `<svg xmlns="http://www.w3.org/2000/svg" width="${size.width}" height="${size.height}" viewBox="0 0 ${size.width} ${size.height}">`,
      `<rect width="${size.width}" height="${size.height}" fill="#ffffff"/>`,
      `<image x="${left + 1}" y="${top + 1}" width="${img.width}" height="${img.height}" image-rendering="pixelated" style="image-rendering:pixelated" href="${c.toDataURL("image/png")}"/>`,
      `<rect x="${left + 0.5}" y="${top + 0.5}" width="${img.width + 1}" height="${img.height + 1}" fill="none" stroke="${FRAME}"/>`,
      ...deco.strips.map((r) => `<rect x="${r.x}" y="${r.y}" width="${r.w}" height="${r.h}" fill="${r.fill}"/>`),
      `<g font-family="${font}" font-size="${LABEL_SIZE}" fill="${chartTheme.text}" dominant-baseline="middle">`,
      ...deco.rowLabels.map((l) => `<text x="${l.x}" y="${l.y}" text-anchor="end">${escapeXml(l.text)}</text>`),
      ...deco.colLabels.map((l) => `<text transform="translate(${l.x} ${l.y}) rotate(-60)">${escapeXml(l.text)}</text>`),
      `</g>`,
      `</svg>`,
      ``,
    ].join("\n");
    return { text, width: size.width, height: size.height };
  };

  function onMove(e: React.MouseEvent<HTMLCanvasElement>) {
    const canvas = canvasRef.current;
    if (!img || !canvas) return;
    const r = canvas.getBoundingClientRect();
    const px = ((e.clientX - r.left) * canvas.width) / r.width - left - 1;
    const py = ((e.clientY - r.top) * canvas.height) / r.height - top - 1;
    if (px < 0 || py < 0 || px >= img.width || py >= img.height) return setHover("");
    describe(Math.floor((py / img.height) * nRows), Math.floor((px / img.width) * nCols));
  }

  // Keyboard: arrow keys move a cursor over the cells (Shift: 10 at a time), Home goes to the first cell.
  const [cursor, setCursor] = useState<[number, number] | null>(null);
  function onKey(e: React.KeyboardEvent<HTMLCanvasElement>) {
    if (!img) return;
    const step = e.shiftKey ? 10 : 1;
    const [r0, c0] = cursor ?? [0, 0];
    const moves: Record<string, [number, number]> = { ArrowUp: [-step, 0], ArrowDown: [step, 0], ArrowLeft: [0, -step], ArrowRight: [0, step], Home: [-r0, -c0] };
    const m = moves[e.key];
    if (!m) return;
    e.preventDefault();
    const next: [number, number] = cursor ? [Math.min(nRows - 1, Math.max(0, r0 + m[0])), Math.min(nCols - 1, Math.max(0, c0 + m[1]))] : [0, 0];
    setCursor(next);
    describe(next[0], next[1]);
  }

  function describe(rp: number, cp: number) {
    if (!img) return;
    const i = img.rowOrder[rp];
    const j = img.colOrder[cp];
    let w = 0;
    for (let p = view.cells.ptr[i]; p < view.cells.ptr[i + 1]; p++) if (view.cells.idx[p] === j) w = view.cells.w ? view.cells.w[p] : 1;
    const mod = (m: number[] | null, k: number) => (m ? ` (module ${m[k] + 1})` : "");
    const where = view.rowModules && view.colModules && w ? (view.rowModules[i] === view.colModules[j] ? ", inside its module" : ", between modules") : "";
    setHover(`${view.rowLabels[i]}${mod(view.rowModules, i)} × ${view.colLabels[j]}${mod(view.colModules, j)}: ${img.cell ? w : w ? "linked" : "no link here"}${where}${img.cell ? "" : " (one pixel covers several cells)"}`);
  }

  // an undirected one-mode link is stored both ways, so its cells count twice
  const twice = square && !view.directed;
  const insideShare = img && partitioned && view.nLinks ? img.insideLinks / (twice ? 2 * view.nLinks : view.nLinks) : null;
  const insideLinks = img ? (twice ? img.insideLinks / 2 : img.insideLinks) : 0;
  const blocks = img?.blocks ?? [];
  return (
    <ChartFigure
      id={id}
      title={title}
      download={download}
      svgOf={svgOf}
      caption={
        <>
          {nRows} {sides.rows} ({square ? "rows" : "row nodes"}) × {nCols} {sides.cols} ({square ? "columns" : "column nodes"}), {view.nLinks} links.{" "}
          {partitioned
            ? `Rows and columns are sorted by module, then by decreasing degree. Each of the ${blocks.length} modules is shaded in its own colour, its links drawn in that colour; links between modules are grey.`
            : "No partition yet: rows and columns are sorted by decreasing degree."}
          {img && !img.cell && ` The picture is ${img.width} × ${img.height} pixels: each pixel stands for several cells, darker where more of them are filled.`}
        </>
      }
    >
      {actions}
      {insideShare !== null && (
        <p className="mb-2 text-stone-800" data-testid="inside-share">
          <span className="text-2xl font-bold tabular-nums text-moss-700">{(insideShare * 100).toFixed(1)} %</span> of links lie inside modules{" "}
          <span className="text-sm text-stone-600">
            ({insideLinks} of {view.nLinks}; the rest connect two modules)
          </span>
        </p>
      )}
      {error && (
        <p role="alert" className="text-red-800">
          {error}
        </p>
      )}
      {!img && !error && <p className="text-stone-700">Drawing the matrix…</p>}
      <div className="relative overflow-auto">
        {img && cursor && canvasRef.current && (
          <div
            aria-hidden="true"
            className="pointer-events-none absolute border-2 border-red-700"
            style={(() => {
              const c = canvasRef.current!;
              const k = c.clientWidth / c.width;
              const sx = img.width / nCols;
              const sy = img.height / nRows;
              return {
                left: (left + 1 + cursor[1] * sx) * k - 2,
                top: (top + 1 + cursor[0] * sy) * k - 2,
                width: Math.max(4, sx * k + 4),
                height: Math.max(4, sy * k + 4),
              };
            })()}
          />
        )}
        <canvas
          ref={canvasRef}
          data-testid="matrix-canvas"
          role="img"
          aria-label={`Interaction matrix, ${nRows} by ${nCols}, ordered by ${partitioned ? "module" : "decreasing degree"}`}
          className="max-w-full"
          style={{ imageRendering: img && !img.cell ? "pixelated" : "auto", display: img ? "block" : "none" }}
          tabIndex={0}
          aria-describedby={`${id}-help`}
          onKeyDown={onKey}
          onBlur={() => setCursor(null)}
          onMouseMove={onMove}
          onMouseLeave={() => setHover("")}
        />
      </div>
      <p className="mt-1 min-h-5 text-sm text-stone-700" aria-live="polite">
        {hover}
      </p>
      <p id={`${id}-help`} className="text-xs text-stone-600">
        Point at a cell, or focus the matrix and use the arrow keys (Shift moves 10 cells), to read its row, column, modules and value.
      </p>
      {partitioned && img && <ModuleLegend blocks={blocks} sides={sides} square={square} twice={twice} />}
      {!partitioned && (
        <p className="mt-2 flex items-center gap-1.5 text-sm text-stone-800">
          <Swatch fill={NO_PARTITION} /> Link
        </p>
      )}
    </ChartFigure>
  );
}

function Swatch({ fill, band }: { fill: string; band?: string }) {
  return (
    <svg width="18" height="14" aria-hidden="true" className="shrink-0">
      {band && <rect x="0" y="0" width="18" height="14" fill={band} />}
      <rect x={band ? 5 : 3} y="3" width="8" height="8" fill={fill} />
    </svg>
  );
}

function ModuleLegend({ blocks, sides, square, twice }: { blocks: MatrixImage["blocks"]; sides: { rows: string; cols: string }; square: boolean; twice: boolean }) {
  const shown = blocks.slice(0, LEGEND_MAX);
  return (
    <div className="mt-2 text-sm text-stone-800">
      <p className="font-semibold">Modules</p>
      <ul className="mt-1 grid gap-x-4 gap-y-1 sm:grid-cols-2 lg:grid-cols-3" aria-label="Modules">
        {shown.map((b) => (
          <li key={b.module} className="flex items-center gap-1.5" data-testid="module-legend-item">
            <Swatch fill={moduleColour(b.module)} band={moduleBand(b.module)} />
            <span>
              <span className="font-semibold">Module {b.module + 1}</span>:{" "}
              {square ? `${b.rowEnd - b.rowStart} ${sides.rows}` : `${b.rowEnd - b.rowStart} ${sides.rows}, ${b.colEnd - b.colStart} ${sides.cols}`} · {twice ? b.linksInside / 2 : b.linksInside} links inside
            </span>
          </li>
        ))}
        <li className="flex items-center gap-1.5">
          <Swatch fill={BETWEEN_MODULES} />
          <span>Link between two modules</span>
        </li>
      </ul>
      {blocks.length > shown.length && <p className="mt-1 text-stone-600">…and {blocks.length - shown.length} more modules (colours repeat after eight; see the module table).</p>}
    </div>
  );
}
