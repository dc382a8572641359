/**
 * The matrix image of the network view: ordering by module, module blocks, one block per cell when cells
 * fit, aggregation when they do not. Checked against direct recomputation from the definition (which
 * pixel each cell falls in), on seeded random networks.
 */
import { describe, expect, it } from "vitest";
import { buildMatrixImage, orderByModule } from "@shared/plots/matrix-image";
import { createRng } from "@shared/network/random";
import { BETWEEN_MODULES, hexToRgb, moduleBand, moduleColour } from "@shared/plots/palette";

function randomCsr(nRows: number, nCols: number, perRow: number, seed: number) {
  const rng = createRng(seed);
  const ptr = [0];
  const idx: number[] = [];
  for (let i = 0; i < nRows; i++) {
    const s = new Set<number>();
    const k = rng.nextInt(perRow + 1);
    while (s.size < k) s.add(rng.nextInt(nCols));
    idx.push(...[...s].sort((a, b) => a - b));
    ptr.push(idx.length);
  }
  return { ptr, idx };
}

const rgbAt = (px: Uint8ClampedArray, k: number) => [px[k * 4], px[k * 4 + 1], px[k * 4 + 2]];
const WHITE = [255, 255, 255];

/** What an empty pixel shows: its module's pale band inside a block (rows × columns of one module), else white. */
function background(img: ReturnType<typeof buildMatrixImage>, rowPos: number, colPos: number): number[] {
  const b = img.blocks.find((b) => rowPos >= b.rowStart && rowPos < b.rowEnd && colPos >= b.colStart && colPos < b.colEnd);
  return b ? hexToRgb(moduleBand(b.module)) : WHITE;
}

describe("orderByModule", () => {
  it("sorts by module, then by decreasing degree, then by index", () => {
    const order = orderByModule(6, [1, 0, 1, 0, 0, 1], [1, 5, 3, 5, 2, 3]);
    expect(Array.from(order)).toEqual([1, 3, 4, 2, 5, 0]);
  });
});

describe("buildMatrixImage", () => {
  it("draws one block per link when cells fit: inside a module in its hue, between modules grey, on the module's pale band", () => {
    const nRows = 12;
    const nCols = 9;
    const { ptr, idx } = randomCsr(nRows, nCols, 5, 3);
    const rowModules = Array.from({ length: nRows }, (_, i) => i % 3);
    const colModules = Array.from({ length: nCols }, (_, j) => j % 3);
    const img = buildMatrixImage({ nRows, nCols, ptr, idx, rowModules, colModules, square: false, maxW: 900, maxH: 600 });
    expect(img.cell).toBe(24); // capped cell size
    expect([img.width, img.height]).toEqual([9 * 24, 12 * 24]);
    const rowPos = new Map(Array.from(img.rowOrder).map((orig, pos) => [orig, pos]));
    const colPos = new Map(Array.from(img.colOrder).map((orig, pos) => [orig, pos]));
    let inside = 0;
    const linked = new Set<string>();
    for (let i = 0; i < nRows; i++) {
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const j = idx[p];
        linked.add(`${rowPos.get(i)},${colPos.get(j)}`);
        const centre = (rowPos.get(i)! * 24 + 12) * img.width + colPos.get(j)! * 24 + 12;
        if (rowModules[i] === colModules[j]) {
          inside++;
          expect(rgbAt(img.pixels, centre)).toEqual(hexToRgb(moduleColour(rowModules[i])));
        } else expect(rgbAt(img.pixels, centre)).toEqual(hexToRgb(BETWEEN_MODULES));
      }
    }
    expect(img.insideLinks).toBe(inside);
    expect(img.blocks.reduce((s, b) => s + b.linksInside, 0)).toBe(inside);
    // cells without a link show their module's band inside a block, white elsewhere
    let banded = 0;
    for (let rp = 0; rp < nRows; rp++)
      for (let cp = 0; cp < nCols; cp++)
        if (!linked.has(`${rp},${cp}`)) {
          const bg = background(img, rp, cp);
          if (bg !== WHITE) banded++;
          expect(rgbAt(img.pixels, (rp * 24 + 12) * img.width + cp * 24 + 12)).toEqual(bg);
        }
    expect(banded).toBeGreaterThan(0);
    // modules form contiguous ranges in the order, one block each
    expect(img.blocks.map((b) => b.module)).toEqual([0, 1, 2]);
    for (const b of img.blocks) {
      for (let p = b.rowStart; p < b.rowEnd; p++) expect(rowModules[img.rowOrder[p]]).toBe(b.module);
      for (let p = b.colStart; p < b.colEnd; p++) expect(colModules[img.colOrder[p]]).toBe(b.module);
    }
  });

  it("aggregates a matrix larger than the picture: exactly the pixels that hold a link differ from their background", () => {
    const nRows = 700;
    const nCols = 1100;
    const { ptr, idx } = randomCsr(nRows, nCols, 6, 11);
    const rowModules = Array.from({ length: nRows }, (_, i) => i % 7);
    const colModules = Array.from({ length: nCols }, (_, j) => j % 7);
    const img = buildMatrixImage({ nRows, nCols, ptr, idx, rowModules, colModules, square: false, maxW: 400, maxH: 300 });
    expect(img.cell).toBe(0);
    expect([img.width, img.height]).toEqual([400, 300]);
    const rowPos = new Int32Array(nRows);
    const colPos = new Int32Array(nCols);
    img.rowOrder.forEach((orig, pos) => (rowPos[orig] = pos));
    img.colOrder.forEach((orig, pos) => (colPos[orig] = pos));
    const expected = new Set<number>();
    for (let i = 0; i < nRows; i++) {
      for (let p = ptr[i]; p < ptr[i + 1]; p++) {
        const x = Math.floor((colPos[idx[p]] * 400) / nCols);
        const y = Math.floor((rowPos[i] * 300) / nRows);
        expected.add(y * 400 + x);
      }
    }
    let inked = 0;
    const sx = 400 / nCols;
    const sy = 300 / nRows;
    // a pixel's band: the blocks having a cell in it (pixels covering two blocks are left out of the check)
    const bandsOf = (x: number, y: number) =>
      img.blocks.filter((b) => b.colStart < (x + 1) / sx && b.colEnd > x / sx && b.rowStart < (y + 1) / sy && b.rowEnd > y / sy);
    for (let k = 0; k < 400 * 300; k++) {
      const bands = bandsOf(k % 400, Math.floor(k / 400));
      if (bands.length > 1) continue;
      const bg = bands.length ? hexToRgb(moduleBand(bands[0].module)) : WHITE;
      const plain = rgbAt(img.pixels, k).every((v, c) => v === bg[c]);
      expect(!plain).toBe(expected.has(k));
      if (!plain) inked++;
    }
    expect(inked).toBeGreaterThan(expected.size * 0.9);
  });

  it("uses one order for rows and columns of a one-mode network", () => {
    const { ptr, idx } = randomCsr(30, 30, 4, 5);
    const modules = Array.from({ length: 30 }, (_, i) => (i * 7) % 4);
    const img = buildMatrixImage({ nRows: 30, nCols: 30, ptr, idx, rowModules: modules, colModules: modules, square: true, maxW: 300, maxH: 300 });
    expect(Array.from(img.colOrder)).toEqual(Array.from(img.rowOrder));
    expect(img.blocks.every((b) => b.rowStart === b.colStart && b.rowEnd === b.colEnd)).toBe(true);
  });
});
