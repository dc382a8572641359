/**
 * A small picture of a network's matrix on a canvas: one cell per (row, column) with a link, darker for
 * heavier weights. Large matrices are drawn with several nodes per pixel. Rows and columns in file order.
 */
import { useEffect, useRef } from "react";

export interface MatrixLike {
  nRows: number;
  nCols: number;
  rowPtr: ArrayLike<number>;
  colIdx: ArrayLike<number>;
  weights: ArrayLike<number> | null;
}

export function MatrixPreview({ matrix, label, size = 160 }: { matrix: MatrixLike; label: string; size?: number }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const { nRows, nCols } = matrix;
  const scale = Math.max(1, Math.floor(size / Math.max(nRows, nCols, 1)));
  const w = Math.min(size, Math.max(1, nCols * scale));
  const h = Math.min(size, Math.max(1, nRows * scale));
  useEffect(() => {
    const c = ref.current;
    const ctx = c?.getContext("2d");
    if (!c || !ctx) return;
    ctx.fillStyle = "#f5f5f4";
    ctx.fillRect(0, 0, w, h);
    let maxW = 0;
    if (matrix.weights) for (let k = 0; k < matrix.weights.length; k++) maxW = Math.max(maxW, matrix.weights[k]);
    const sx = w / Math.max(nCols, 1);
    const sy = h / Math.max(nRows, 1);
    for (let i = 0; i < nRows; i++) {
      for (let k = matrix.rowPtr[i]; k < matrix.rowPtr[i + 1]; k++) {
        const j = matrix.colIdx[k];
        const t = matrix.weights && maxW > 0 ? 0.35 + 0.65 * Math.log1p(matrix.weights[k]) / Math.log1p(maxW) : 1;
        ctx.fillStyle = `rgba(31, 77, 58, ${t.toFixed(3)})`;
        ctx.fillRect(Math.floor(j * sx), Math.floor(i * sy), Math.max(1, Math.ceil(sx)), Math.max(1, Math.ceil(sy)));
      }
    }
  }, [matrix, w, h, nRows, nCols]);
  return <canvas ref={ref} width={w} height={h} role="img" aria-label={label} className="rounded ring-1 ring-stone-300" style={{ width: w, height: h, imageRendering: "pixelated" }} />;
}

/** From the engine's canonical JSON ({ rows, cols, ptr, idx, w }). */
export function matrixFromCanonical(c: { rows: string[]; cols: string[] | null; ptr: number[]; idx: number[]; w: number[] | null }): MatrixLike {
  return { nRows: c.rows.length, nCols: (c.cols ?? c.rows).length, rowPtr: c.ptr, colIdx: c.idx, weights: c.w };
}
