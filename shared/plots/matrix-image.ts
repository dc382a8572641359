/**
 * The matrix image of a network ordered by module: rows and columns sorted by module, then by decreasing
 * degree, so that modules appear as blocks on the diagonal. Pure functions: they run in the browser's Web
 * Worker (the network view) and on the server (preview images).
 *
 * Look: each module's block (its rows × its columns) is shaded with the pale band colour of its module,
 * a link inside a module is drawn in the module's hue, and a link between modules in one neutral grey
 * (shared/plots/palette.ts). Without a partition every link is drawn in dark grey on white.
 *
 * Two drawing modes: when every cell gets at least one pixel each way, cells are drawn as square blocks of
 * `cell` pixels; otherwise the image is at most maxW × maxH pixels and each pixel aggregates the cells that
 * fall in it (its shade grows with the share of filled cells), so a 3000 × 5000 network becomes ~1 pixel
 * per 5 × 5 cells instead of 15 million rectangles.
 */
import { BAND_TINT, BETWEEN_MODULES, hexToRgb, moduleRgb, NO_PARTITION, tint, type Rgb } from "./palette";

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
  /** Non-zero cells inside the block (an undirected one-mode link is stored, and counted, twice). */
  linksInside: number;
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
    return { module, rowStart: r[0], rowEnd: r[1], colStart: c[0], colEnd: c[1], linksInside: 0 };
  });
}

const BETWEEN = hexToRgb(BETWEEN_MODULES);
const PLAIN = hexToRgb(NO_PARTITION);

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
  const partitioned = !!(rowModules && colModules);
  const blocks = rowModules && colModules ? moduleBlocks(rowOrder, colOrder, rowModules, colModules) : [];
  const hue = new Map<number, Rgb>();
  const hueOf = (m: number) => {
    let c = hue.get(m);
    if (!c) hue.set(m, (c = moduleRgb(m)));
    return c;
  };
  const put = (o: number, c: Rgb) => {
    pixels[o] = c[0];
    pixels[o + 1] = c[1];
    pixels[o + 2] = c[2];
  };
  // module bands: each block (the module's rows × its columns) in the pale tint of its hue
  const sx = width / Math.max(nCols, 1);
  const sy = height / Math.max(nRows, 1);
  for (const b of blocks) {
    if (b.rowEnd <= b.rowStart || b.colEnd <= b.colStart) continue;
    const band = tint(hueOf(b.module), BAND_TINT);
    const x0 = Math.floor(b.colStart * sx);
    const x1 = Math.min(width, Math.ceil(b.colEnd * sx));
    const y0 = Math.floor(b.rowStart * sy);
    const y1 = Math.min(height, Math.ceil(b.rowEnd * sy));
    for (let y = y0; y < y1; y++) for (let x = x0, o = (y * width + x0) * 4; x < x1; x++, o += 4) put(o, band);
  }

  if (cell) {
    for (let i = 0; i < nRows; i++) {
      const y0 = rowPos[i] * cell;
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const j = idx[p];
        const inside = partitioned && rowModules![i] === colModules![j];
        if (inside) insideLinks++;
        const c = !partitioned ? PLAIN : inside ? hueOf(rowModules![i]) : BETWEEN;
        const x0 = colPos[j] * cell;
        // leave a 1-pixel gap between cells when they are big enough to show it
        const s = cell >= 4 ? cell - 1 : cell;
        for (let y = y0; y < y0 + s; y++) {
          let o = (y * width + x0) * 4;
          for (let x = 0; x < s; x++, o += 4) put(o, c);
        }
      }
    }
  } else {
    const inside = new Float32Array(width * height);
    const outside = new Float32Array(width * height);
    /** module + 1 of the inside links in a pixel (rows are sorted by module, so a pixel rarely mixes two) */
    const pixelModule = new Int32Array(width * height);
    for (let i = 0; i < nRows; i++) {
      const y = Math.min(height - 1, Math.floor(rowPos[i] * sy));
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const j = idx[p];
        const x = Math.min(width - 1, Math.floor(colPos[j] * sx));
        const k = y * width + x;
        if (!partitioned || rowModules![i] === colModules![j]) {
          inside[k]++;
          if (partitioned) {
            insideLinks++;
            pixelModule[k] = rowModules![i] + 1;
          }
        } else outside[k]++;
      }
    }
    const cellsPerPixel = (nCols / width) * (nRows / height);
    for (let k = 0; k < width * height; k++) {
      const n = inside[k] + outside[k];
      if (!n) continue;
      // a lone link stays visible (35 % ink); a full pixel is full colour, over the band or white beneath
      const t = 0.35 + 0.65 * Math.min(1, Math.sqrt(n / cellsPerPixel));
      const c = !partitioned ? PLAIN : inside[k] >= outside[k] ? hueOf(pixelModule[k] - 1) : BETWEEN;
      const o = k * 4;
      pixels[o] = pixels[o] - t * (pixels[o] - c[0]);
      pixels[o + 1] = pixels[o + 1] - t * (pixels[o + 1] - c[1]);
      pixels[o + 2] = pixels[o + 2] - t * (pixels[o + 2] - c[2]);
    }
  }
  if (partitioned) {
    const blockOf = new Map(blocks.map((b) => [b.module, b]));
    for (let i = 0; i < nRows; i++) {
      const b = blockOf.get(rowModules![i]);
      for (let p = ptr[i]; p < ptr[i + 1]; p++) if (b && colModules![idx[p]] === b.module) b.linksInside++;
    }
  }
  return { width, height, cell, pixels, rowOrder, colOrder, blocks, insideLinks };
}
