/**
 * The matrix image of a network ordered by module: rows and columns sorted by module, then by decreasing
 * degree, so that modules appear as blocks on the diagonal. Pure functions (they run in a Web Worker).
 *
 * Two drawing modes: when every cell gets at least one pixel each way, cells are drawn as square blocks of
 * `cell` pixels; otherwise the image is at most maxW × maxH pixels and each pixel aggregates the cells that
 * fall in it (its shade grows with the share of filled cells), so a 3000 × 5000 network becomes ~1 pixel
 * per 5 × 5 cells instead of 15 million rectangles.
 */
export interface MatrixInput {
  nRows: number;
  nCols: number;
  ptr: ArrayLike<number>;
  idx: ArrayLike<number>;
  rowModules: ArrayLike<number> | null;
  colModules: ArrayLike<number> | null;
  /** One-mode networks use one order for rows and columns. */
  square: boolean;
  maxW: number;
  maxH: number;
  maxCell?: number;
}

export interface ModuleBlock {
  module: number;
  rowStart: number;
  rowEnd: number;
  colStart: number;
  colEnd: number;
}

export interface MatrixImage {
  width: number;
  height: number;
  /** pixels per cell (≥ 1) or 0 in aggregated mode */
  cell: number;
  pixels: Uint8ClampedArray;
  rowOrder: Int32Array;
  colOrder: Int32Array;
  blocks: ModuleBlock[];
  insideLinks: number;
}

/** Positions → original indices, sorted by module, then decreasing degree, then index. */
export function orderByModule(n: number, modules: ArrayLike<number> | null, degree: ArrayLike<number>): Int32Array {
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  const mod = (i: number) => (modules ? modules[i] : 0);
  return order.sort((a, b) => mod(a) - mod(b) || degree[b] - degree[a] || a - b);
}

export function moduleBlocks(rowOrder: Int32Array, colOrder: Int32Array, rowModules: ArrayLike<number>, colModules: ArrayLike<number>): ModuleBlock[] {
  const ranges = (order: Int32Array, mods: ArrayLike<number>) => {
    const m = new Map<number, [number, number]>();
    for (let p = 0; p < order.length; p++) {
      const k = mods[order[p]];
      const r = m.get(k);
      if (r) r[1] = p + 1;
      else m.set(k, [p, p + 1]);
    }
    return m;
  };
  const rr = ranges(rowOrder, rowModules);
  const cr = ranges(colOrder, colModules);
  const keys = [...new Set([...rr.keys(), ...cr.keys()])].sort((a, b) => a - b);
  return keys.map((module) => {
    const r = rr.get(module) ?? [0, 0];
    const c = cr.get(module) ?? [0, 0];
    return { module, rowStart: r[0], rowEnd: r[1], colStart: c[0], colEnd: c[1] };
  });
}

const INSIDE = [31, 77, 58]; // moss-700
const OUTSIDE = [120, 113, 108]; // stone-500

export function buildMatrixImage(input: MatrixInput): MatrixImage {
  const { nRows, nCols, ptr, idx, rowModules, colModules, maxW, maxH } = input;
  const maxCell = input.maxCell ?? 24;
  const rowDeg = new Float64Array(nRows);
  const colDeg = new Float64Array(nCols);
  for (let i = 0; i < nRows; i++) {
    rowDeg[i] = ptr[i + 1] - ptr[i];
    for (let p = ptr[i]; p < ptr[i + 1]; p++) colDeg[idx[p]]++;
  }
  const rowOrder = orderByModule(nRows, rowModules, input.square ? Float64Array.from(rowDeg, (d, i) => d + colDeg[i]) : rowDeg);
  const colOrder = input.square ? rowOrder : orderByModule(nCols, colModules, colDeg);
  const rowPos = new Int32Array(nRows);
  const colPos = new Int32Array(nCols);
  rowOrder.forEach((orig, pos) => (rowPos[orig] = pos));
  colOrder.forEach((orig, pos) => (colPos[orig] = pos));

  const fit = Math.min(maxW / Math.max(nCols, 1), maxH / Math.max(nRows, 1));
  const cell = fit >= 1 ? Math.max(1, Math.min(maxCell, Math.floor(fit))) : 0;
  const width = cell ? nCols * cell : Math.min(maxW, nCols);
  const height = cell ? nRows * cell : Math.min(maxH, nRows);
  const pixels = new Uint8ClampedArray(width * height * 4).fill(255);
  let insideLinks = 0;

  if (cell) {
    for (let i = 0; i < nRows; i++) {
      const y0 = rowPos[i] * cell;
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const j = idx[p];
        const inside = !rowModules || !colModules || rowModules[i] === colModules[j];
        if (inside && rowModules) insideLinks++;
        const c = inside ? INSIDE : OUTSIDE;
        const x0 = colPos[j] * cell;
        // leave a 1-pixel gap between cells when they are big enough to show it
        const s = cell >= 4 ? cell - 1 : cell;
        for (let y = y0; y < y0 + s; y++) {
          let o = (y * width + x0) * 4;
          for (let x = 0; x < s; x++, o += 4) {
            pixels[o] = c[0];
            pixels[o + 1] = c[1];
            pixels[o + 2] = c[2];
          }
        }
      }
    }
  } else {
    const inside = new Float32Array(width * height);
    const outside = new Float32Array(width * height);
    const sx = width / nCols;
    const sy = height / nRows;
    for (let i = 0; i < nRows; i++) {
      const y = Math.min(height - 1, Math.floor(rowPos[i] * sy));
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const j = idx[p];
        const x = Math.min(width - 1, Math.floor(colPos[j] * sx));
        if (!rowModules || !colModules || rowModules[i] === colModules[j]) {
          inside[y * width + x]++;
          if (rowModules) insideLinks++;
        } else outside[y * width + x]++;
      }
    }
    const cellsPerPixel = (nCols / width) * (nRows / height);
    for (let k = 0; k < width * height; k++) {
      const n = inside[k] + outside[k];
      if (!n) continue;
      // a lone link stays visible (35 % ink); a full pixel is full colour
      const t = 0.35 + 0.65 * Math.min(1, Math.sqrt(n / cellsPerPixel));
      const c = inside[k] >= outside[k] ? INSIDE : OUTSIDE;
      const o = k * 4;
      pixels[o] = 255 - t * (255 - c[0]);
      pixels[o + 1] = 255 - t * (255 - c[1]);
      pixels[o + 2] = 255 - t * (255 - c[2]);
    }
  }
  const blocks = rowModules && colModules ? moduleBlocks(rowOrder, colOrder, rowModules, colModules) : [];
  return { width, height, cell, pixels, rowOrder, colOrder, blocks, insideLinks };
}
