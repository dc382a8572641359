/**
 * The interaction matrix ordered by module on a canvas, module blocks outlined. The image is built in a
 * Web Worker (utils/matrix.worker.ts) and painted once; `data-rendered="true"` marks the finished drawing
 * (the benchmark waits for it). Row and column labels are drawn when cells are large enough to read them.
 */
import { useEffect, useMemo, useRef, useState } from "react";
import type { NetworkView } from "../../../../../shared/types/network-view";
import type { MatrixImage } from "../utils/matrix-layout";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Legend } from "../../../components/charts/legend";
import { chartTheme } from "../../../components/charts/theme";

const MAX_W = 960;
const MAX_H = 720;
let nextId = 1;

export function MatrixCanvas({ view }: { view: NetworkView }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const [img, setImg] = useState<MatrixImage | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [hover, setHover] = useState<string>("");
  const rowLevel = view.metadata.rowLevel ?? (view.kind === "bipartite" ? "rows" : "nodes");
  const colLevel = view.metadata.colLevel ?? (view.kind === "bipartite" ? "columns" : "nodes");
  const square = view.kind !== "bipartite";
  const nRows = view.rowLabels.length;
  const nCols = view.colLabels.length;

  useEffect(() => {
    const id = nextId++;
    const worker = new Worker(new URL("../utils/matrix.worker.ts", import.meta.url), { type: "module" });
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
  // margins fit the longest (cut to 20 characters) row label and the rotated column labels
  const { left, top } = useMemo(() => {
    if (!labelled) return { left: 0, top: 0 };
    const ctx = document.createElement("canvas").getContext("2d");
    if (!ctx) return { left: 130, top: 110 };
    ctx.font = `11px ${chartTheme.font}`;
    const widest = (labels: string[]) => labels.reduce((w, l) => Math.max(w, ctx.measureText(l.slice(0, 20)).width), 0);
    return { left: Math.ceil(widest(view.rowLabels)) + 10, top: Math.ceil(widest(view.colLabels) * Math.sin(Math.PI / 3)) + 12 };
  }, [labelled, view]);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!img || !canvas) return;
    canvas.width = img.width + left + 2;
    canvas.height = img.height + top + 2;
    const ctx = canvas.getContext("2d")!;
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.putImageData(new ImageData(new Uint8ClampedArray(img.pixels), img.width, img.height), left + 1, top + 1);
    ctx.strokeStyle = "#a8a29e";
    ctx.lineWidth = 1;
    ctx.strokeRect(left + 0.5, top + 0.5, img.width + 1, img.height + 1);
    const sx = img.width / nCols;
    const sy = img.height / nRows;
    ctx.strokeStyle = chartTheme.accent;
    ctx.lineWidth = 2;
    for (const b of img.blocks) {
      if (b.rowEnd <= b.rowStart || b.colEnd <= b.colStart) continue;
      const x0 = left + 1 + Math.floor(b.colStart * sx);
      const x1 = left + 1 + Math.ceil(b.colEnd * sx);
      const y0 = top + 1 + Math.floor(b.rowStart * sy);
      const y1 = top + 1 + Math.ceil(b.rowEnd * sy);
      ctx.strokeRect(x0, y0, Math.max(1, x1 - x0), Math.max(1, y1 - y0));
    }
    if (labelled) {
      ctx.fillStyle = chartTheme.text;
      ctx.font = `11px ${chartTheme.font}`;
      ctx.textAlign = "right";
      ctx.textBaseline = "middle";
      img.rowOrder.forEach((orig, pos) => ctx.fillText(view.rowLabels[orig].slice(0, 20), left - 4, top + 1 + (pos + 0.5) * img.cell));
      ctx.save();
      ctx.textAlign = "left";
      img.colOrder.forEach((orig, pos) => {
        ctx.save();
        ctx.translate(left + 1 + (pos + 0.5) * img.cell, top - 4);
        ctx.rotate(-Math.PI / 3);
        ctx.fillText(view.colLabels[orig].slice(0, 20), 0, 0);
        ctx.restore();
      });
      ctx.restore();
    }
    canvas.dataset.rendered = "true";
  }, [img, left, top, labelled, nCols, nRows, view]);

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
    setHover(`${view.rowLabels[i]}${mod(view.rowModules, i)} × ${view.colLabels[j]}${mod(view.colModules, j)}: ${img.cell ? w : w ? "linked" : "no link here"}${img.cell ? "" : " (one pixel covers several cells)"}`);
  }

  const nModules = img?.blocks.length ?? 0;
  const insideShare = img && view.nLinks ? img.insideLinks / (square && !view.directed ? 2 * view.nLinks : view.nLinks) : null;
  return (
    <ChartFigure
      id="matrix"
      title="Interaction matrix ordered by module"
      caption={
        <>
          {nRows} {rowLevel} (rows) × {nCols} {colLevel} (columns), {view.nLinks} links.{" "}
          {view.rowModules
            ? `Rows and columns are sorted by module and then by decreasing degree; the ${nModules} module blocks are outlined in gold. ${insideShare !== null ? `${(insideShare * 100).toFixed(1)} % of links fall inside modules.` : ""}`
            : "No partition yet: rows and columns are sorted by decreasing degree."}
          {img && !img.cell && ` The picture is ${img.width} × ${img.height} pixels: each pixel stands for several cells, darker where more of them are filled.`}
        </>
      }
    >
      {error && <p role="alert" className="text-red-800">{error}</p>}
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
          aria-label={`Interaction matrix, ${nRows} by ${nCols}, ordered by module`}
          className="max-w-full"
          style={{ imageRendering: img && !img.cell ? "pixelated" : "auto", display: img ? "block" : "none" }}
          tabIndex={0}
          aria-describedby="matrix-help"
          onKeyDown={onKey}
          onBlur={() => setCursor(null)}
          onMouseMove={onMove}
          onMouseLeave={() => setHover("")}
        />
      </div>
      <p className="mt-1 min-h-5 text-sm text-stone-700" aria-live="polite">
        {hover}
      </p>
      <p id="matrix-help" className="text-xs text-stone-600">
        Point at a cell, or focus the matrix and use the arrow keys (Shift moves 10 cells), to read its row, column, modules and value.
      </p>
      <Legend
        items={[
          { label: "Link inside a module", colour: "#1f4d3a", shape: "square" },
          { label: "Link between modules", colour: "#78716c", shape: "square" },
          { label: "Module block", colour: chartTheme.accent, shape: "line" },
        ]}
      />
    </ChartFigure>
  );
}
