/**
 * Link-preview images (1200 × 630 PNG, the size link cards show) drawn from the same plot code as the
 * network page: each network's matrix ordered by module (shared/plots/matrix-image.ts), with a strip under
 * it showing its modules' sizes in their colours. A dataset's card shows up to three of its networks side
 * by side. No text is drawn: the page's title and description travel beside the image in its meta tags.
 */
import { PNG } from "pngjs";
import { buildMatrixImage, type MatrixInput } from "@shared/plots/matrix-image";
import { hexToRgb, moduleRgb, type Rgb } from "@shared/plots/palette";

export const PREVIEW_WIDTH = 1200;
export const PREVIEW_HEIGHT = 630;
/** Networks shown on a dataset's card. */
export const PREVIEW_MAX_TILES = 3;

const BACKGROUND = hexToRgb("#f5f5f4"); // stone-100
const FRAME = hexToRgb("#d6d3d1"); // stone-300
const MARGIN = 48;
const GAP = 40;
const STRIP = 14;
const STRIP_GAP = 10;

export type PreviewNetwork = Omit<MatrixInput, "maxW" | "maxH" | "maxCell">;

class Canvas {
  readonly data: Buffer;
  constructor(
    readonly width: number,
    readonly height: number,
  ) {
    this.data = Buffer.alloc(width * height * 4);
    this.fill(0, 0, width, height, BACKGROUND);
  }

  fill(x0: number, y0: number, w: number, h: number, c: Rgb): void {
    const x1 = Math.min(this.width, Math.round(x0 + w));
    const y1 = Math.min(this.height, Math.round(y0 + h));
    for (let y = Math.max(0, Math.round(y0)); y < y1; y++) {
      for (let x = Math.max(0, Math.round(x0)), o = (y * this.width + x) * 4; x < x1; x++, o += 4) {
        this.data[o] = c[0];
        this.data[o + 1] = c[1];
        this.data[o + 2] = c[2];
        this.data[o + 3] = 255;
      }
    }
  }

  /** Copies an RGBA image with its top-left corner at (x0, y0). */
  blit(x0: number, y0: number, w: number, h: number, pixels: Uint8ClampedArray): void {
    for (let y = 0; y < h; y++) {
      const ty = y0 + y;
      if (ty < 0 || ty >= this.height) continue;
      for (let x = 0; x < w; x++) {
        const tx = x0 + x;
        if (tx < 0 || tx >= this.width) continue;
        const s = (y * w + x) * 4;
        const t = (ty * this.width + tx) * 4;
        this.data[t] = pixels[s];
        this.data[t + 1] = pixels[s + 1];
        this.data[t + 2] = pixels[s + 2];
        this.data[t + 3] = 255;
      }
    }
  }
}

/** Nodes per module (rows and columns of a two-mode network; the nodes once for a one-mode network). */
function moduleSizes(net: PreviewNetwork): Array<[number, number]> {
  const sizes = new Map<number, number>();
  const add = (mods: ArrayLike<number> | null) => {
    if (!mods) return;
    for (let i = 0; i < mods.length; i++) sizes.set(mods[i], (sizes.get(mods[i]) ?? 0) + 1);
  };
  add(net.rowModules);
  if (!net.square) add(net.colModules);
  return [...sizes.entries()].sort((a, b) => a[0] - b[0]);
}

/** The card of one network (`networks.length` = 1) or of a dataset's first networks, as RGBA pixels. */
export function drawPreview(networks: PreviewNetwork[]): Canvas {
  const canvas = new Canvas(PREVIEW_WIDTH, PREVIEW_HEIGHT);
  const shown = networks.slice(0, PREVIEW_MAX_TILES);
  if (!shown.length) return canvas;
  const tileW = Math.floor((PREVIEW_WIDTH - 2 * MARGIN - GAP * (shown.length - 1)) / shown.length);
  const tileH = PREVIEW_HEIGHT - 2 * MARGIN - STRIP - STRIP_GAP;
  shown.forEach((net, k) => {
    const img = buildMatrixImage({ ...net, maxW: tileW - 2, maxH: tileH - 2, maxCell: 64 });
    const x0 = MARGIN + k * (tileW + GAP) + Math.floor((tileW - img.width - 2) / 2);
    const y0 = MARGIN + Math.floor((tileH - img.height - 2) / 2);
    canvas.fill(x0, y0, img.width + 2, img.height + 2, FRAME);
    canvas.blit(x0 + 1, y0 + 1, img.width, img.height, img.pixels);
    // the modules' sizes as one strip of their colours, as wide as the matrix
    const sizes = moduleSizes(net);
    const total = sizes.reduce((s, [, n]) => s + n, 0);
    const stripY = y0 + img.height + 2 + STRIP_GAP;
    if (!total) {
      canvas.fill(x0, stripY, img.width + 2, STRIP, FRAME);
      return;
    }
    let x = x0;
    for (const [module, n] of sizes) {
      const w = ((img.width + 2) * n) / total;
      canvas.fill(x, stripY, Math.max(1, w - 2), STRIP, moduleRgb(module));
      x += w;
    }
  });
  return canvas;
}

/** The card as a PNG file. */
export function previewPng(networks: PreviewNetwork[]): Buffer {
  const canvas = drawPreview(networks);
  const png = new PNG({ width: canvas.width, height: canvas.height });
  canvas.data.copy(png.data);
  return PNG.sync.write(png, { colorType: 2, deflateLevel: 6 });
}
