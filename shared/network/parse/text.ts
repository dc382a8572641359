/**
 * Text-level helpers of the parser: UTF-8 decoding with a located error, delimiter detection, numbers.
 * Browser-safe (TextDecoder exists in browsers and Node).
 */
import { NetworkParseError } from "./errors";

/** Decodes UTF-8 bytes (a UTF-8 BOM is dropped); other encodings raise "not-utf8" with line and byte column. */
export function decodeUtf8(bytes: Uint8Array, file: string): string {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) {
    throw new NetworkParseError("not-utf8", { file, row: 1, column: 1 },
      "the file is UTF-16 encoded (byte-order mark FF FE or FE FF); save it as UTF-8 (a UTF-8 byte-order mark is fine)");
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    const at = firstInvalidUtf8(bytes);
    let line = 1;
    let lineStart = 0;
    for (let k = 0; k < at; k++) {
      if (bytes[k] === 0x0a) {
        line++;
        lineStart = k + 1;
      }
    }
    const hex = Array.from(bytes.subarray(at, Math.min(at + 4, bytes.length)), (b) => b.toString(16).toUpperCase().padStart(2, "0")).join(" ");
    throw new NetworkParseError("not-utf8", { file, row: line, column: null },
      `the file is not valid UTF-8: invalid byte sequence ${hex} at byte ${at - lineStart + 1} of the line (byte offset ${at}); save the file as UTF-8 (e.g. it may be Latin-1 or Windows-1252)`);
  }
}

/** Index of the first byte that starts an invalid UTF-8 sequence (bytes.length when valid). */
export function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  const n = b.length;
  while (i < n) {
    const c = b[i];
    if (c < 0x80) { i++; continue; }
    let need: number;
    let min: number;
    if (c >= 0xc2 && c <= 0xdf) { need = 1; min = 0x80; }
    else if (c >= 0xe0 && c <= 0xef) { need = 2; min = 0x800; }
    else if (c >= 0xf0 && c <= 0xf4) { need = 3; min = 0x10000; }
    else return i;
    if (i + need >= n) return i;
    let cp = c & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      const cc = b[i + k];
      if (cc === undefined || (cc & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (cc & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return n;
}

/** UTF-8 byte length of a string. */
export function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff) { n += 4; i++; }
    else n += 3;
  }
  return n;
}

export const DELIMITERS = ["\t", ";", ","] as const;
export type Delimiter = (typeof DELIMITERS)[number] | " ";

/**
 * Picks the delimiter from the first non-empty line: the most frequent of tab, semicolon and comma outside
 * double quotes (ties: tab, then semicolon, then comma); a space when none occurs and spaces separate
 * fields (R's write.table); comma otherwise (a single-column file).
 */
export function detectDelimiter(text: string): Delimiter {
  let start = 0;
  while (start < text.length) {
    let end = text.indexOf("\n", start);
    if (end < 0) end = text.length;
    const line = text.slice(start, end);
    if (line.trim() !== "") {
      const counts = { "\t": 0, ";": 0, ",": 0 } as Record<Delimiter, number>;
      let quoted = false;
      for (let k = 0; k < line.length; k++) {
        const ch = line[k];
        if (ch === '"') quoted = !quoted;
        else if (!quoted && (ch === "\t" || ch === ";" || ch === ",")) counts[ch as Delimiter]++;
      }
      let best: Delimiter = ",";
      let bestCount = 0;
      for (const d of DELIMITERS) {
        if (counts[d] > bestCount) {
          best = d;
          bestCount = counts[d];
        }
      }
      // R's write.table separates by spaces by default: a space outside quotes between fields.
      if (bestCount === 0 && /^\s*("[^"]*"|\S+)( +("[^"]*"|\S+))+\s*$/.test(line)) return " ";
      return best;
    }
    start = end + 1;
  }
  return ",";
}

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?\d+,\d+$/;

/**
 * Parses a cell as a number. Blank → 0. Accepts decimal points and exponents; with `decimalComma`
 * (semicolon-delimited files, as spreadsheets write them where the comma is the decimal separator) also
 * "1,5". Returns NaN when the cell is not a number.
 */
export function parseCellNumber(raw: string, decimalComma: boolean): number {
  if (raw === "" || raw === "0") return 0;
  if (raw === "1") return 1;
  const s = raw.trim();
  if (s === "") return 0;
  if (NUMBER.test(s)) return Number(s);
  if (decimalComma && DECIMAL_COMMA.test(s)) return Number(s.replace(",", "."));
  return NaN;
}

/** Name of a delimiter for messages. */
export function delimiterName(d: string): string {
  return d === "\t" ? "tab" : d === ";" ? "semicolon" : d === "," ? "comma" : d === " " ? "space" : JSON.stringify(d);
}
