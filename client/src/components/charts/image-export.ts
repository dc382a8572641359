/**
 * Charts as image files for slides and papers: an SVG as a standalone file (each element's computed fill,
 * stroke and font written on it, since the app's CSS does not travel with the file), with the chart's
 * title above it and its caption below (a figure moved to a slide keeps what it shows and how to read
 * it), and a PNG drawn from that SVG at twice the size shown, on white. Charts drawn on a canvas (the
 * interaction matrix) give their own SVG of the same drawing.
 */
import { chartTheme } from "./theme";
const STYLE_PROPS = ["fill", "fill-opacity", "stroke", "stroke-width", "stroke-opacity", "stroke-dasharray", "opacity", "font-family", "font-size", "font-weight", "text-anchor", "dominant-baseline"] as const;

/** An SVG file's text with its size (user units, drawn 1:1 on screen). */
export interface SvgFile {
  text: string;
  width: number;
  height: number;
}

export function escapeXml(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** Splits text into lines of at most `max` characters, at spaces where possible. */
export function wrapText(text: string, max: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.replace(/\s+/g, " ").trim().split(" ")) {
    if (!word) continue;
    if (line && line.length + 1 + word.length > max) {
      lines.push(line);
      line = "";
    }
    line = line ? `${line} ${word}` : word;
    while (line.length > max) {
      lines.push(line.slice(0, max));
      line = line.slice(max);
    }
  }
  if (line) lines.push(line);
  return lines;
}

const TITLE_SIZE = 16;
const CAPTION_SIZE = 12;
const PAD = 12;

/**
 * A chart's SVG framed as a figure: its title above, the chart, and its caption (wrapped to the figure's
 * width) below. `chart` is a standalone SVG document's text.
 */
export function figureSvg(chart: SvgFile, title: string, caption: string): SvgFile {
  const width = Math.max(chart.width, 480);
  const perLine = Math.max(30, Math.floor((width - 2 * PAD) / (CAPTION_SIZE * 0.55)));
  const lines = wrapText(caption, perLine);
  const chartTop = PAD + TITLE_SIZE + 10;
  const captionTop = chartTop + chart.height + 10;
  const height = Math.ceil(captionTop + lines.length * CAPTION_SIZE * 1.45 + PAD);
  const inner = chart.text.replace(/^<\?xml[^>]*>\s*/, "").replace(/^<svg\b/, `<svg x="${Math.round((width - chart.width) / 2)}" y="${chartTop}"`);
  const font = escapeXml(chartTheme.font);
  const text = [
    `<?xml version="1.0" encoding="UTF-8"?>`,
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    `<rect width="${width}" height="${height}" fill="#ffffff"/>`,
    `<text x="${PAD}" y="${PAD + TITLE_SIZE}" font-family="${font}" font-size="${TITLE_SIZE}" font-weight="700" fill="${chartTheme.mark}">${escapeXml(title)}</text>`,
    inner.trim(),
    ...lines.map((l, i) => `<text x="${PAD}" y="${(captionTop + (i + 1) * CAPTION_SIZE * 1.45 - 4).toFixed(1)}" font-family="${font}" font-size="${CAPTION_SIZE}" fill="${chartTheme.text}">${escapeXml(l)}</text>`),
    `</svg>`,
    ``,
  ].join("\n");
  return { text, width, height };
}

/** The SVG element as a standalone file (namespace, size and computed styles written on each element). */
export function serializeSvg(svg: SVGSVGElement): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  const vb = svg.viewBox.baseVal;
  if (vb && vb.width) {
    clone.setAttribute("width", String(vb.width));
    clone.setAttribute("height", String(vb.height));
  }
  // computed styles onto the clone, element by element (both trees have the same shape)
  const from = [svg, ...Array.from(svg.querySelectorAll("*"))];
  const to = [clone, ...Array.from(clone.querySelectorAll("*"))];
  if (typeof getComputedStyle === "function") {
    from.forEach((el, i) => {
      const cs = getComputedStyle(el);
      for (const p of STYLE_PROPS) {
        const v = cs.getPropertyValue(p);
        if (v && !to[i].hasAttribute(p)) to[i].setAttribute(p, v);
      }
    });
  }
  clone.querySelectorAll("[tabindex]").forEach((el) => el.removeAttribute("tabindex"));
  clone.querySelectorAll("[class]").forEach((el) => el.removeAttribute("class"));
  clone.removeAttribute("class");
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(clone)}\n`;
}

function canvasBlob(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error("The image could not be made."))), "image/png"));
}

/** The drawn size of an SVG chart (its view box, else its box on the page). */
export function svgSize(svg: SVGSVGElement): { width: number; height: number } {
  const vb = svg.viewBox.baseVal;
  return vb && vb.width ? { width: vb.width, height: vb.height } : { width: svg.clientWidth, height: svg.clientHeight };
}

/** A PNG of an SVG file at `scale` × its size, on white. */
export async function svgToPng(file: SvgFile, scale = 2): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([file.text], { type: "image/svg+xml" }));
  try {
    const img = new Image();
    img.width = file.width;
    img.height = file.height;
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error("The chart could not be drawn as an image."));
      img.src = url;
    });
    const canvas = document.createElement("canvas");
    canvas.width = Math.round(file.width * scale);
    canvas.height = Math.round(file.height * scale);
    const ctx = canvas.getContext("2d")!;
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    return await canvasBlob(canvas);
  } finally {
    URL.revokeObjectURL(url);
  }
}
