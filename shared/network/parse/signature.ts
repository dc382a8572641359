/**
 * What a file is, from its first bytes (its "magic number"), so a picture or a PDF renamed `.csv` is named
 * for what it is instead of being read as text with misleading advice about encodings. Zip containers are
 * told apart by the part names inside (an .xlsx workbook holds `xl/workbook.xml`, a Word document
 * `word/document.xml`, an OpenDocument spreadsheet starts with its `mimetype` entry).
 * Browser-safe: works on a Uint8Array.
 */

export type FileType =
  | "xlsx" | "xls" | "ods" | "docx" | "pptx" | "zip" | "gzip" | "png" | "jpeg" | "gif" | "webp" | "tiff" | "bmp"
  | "pdf" | "sqlite" | "rdata" | "binary";

export interface FileSignature {
  type: FileType;
  /** What the file is, for messages ("a PNG image"). */
  what: string;
}

const WHAT: Record<FileType, string> = {
  xlsx: "an Excel workbook (.xlsx)",
  xls: "an Excel 97–2003 workbook (.xls)",
  ods: "an OpenDocument spreadsheet (.ods)",
  docx: "a Word document (.docx)",
  pptx: "a PowerPoint presentation (.pptx)",
  zip: "a zip archive",
  gzip: "a gzip-compressed file (e.g. an R .rds or .RData file)",
  png: "a PNG image",
  jpeg: "a JPEG image",
  gif: "a GIF image",
  webp: "a WebP image",
  tiff: "a TIFF image",
  bmp: "a BMP image",
  pdf: "a PDF document",
  sqlite: "an SQLite database",
  rdata: "an R workspace (.RData)",
  binary: "a binary file, not text",
};

function startsWith(b: Uint8Array, sig: number[], at = 0): boolean {
  if (b.length < at + sig.length) return false;
  for (let k = 0; k < sig.length; k++) if (b[at + k] !== sig[k]) return false;
  return true;
}

const ascii = (s: string) => Array.from(s, (c) => c.charCodeAt(0));

/** Index of an ASCII string inside the bytes, or -1. */
export function indexOfAscii(b: Uint8Array, s: string, from = 0): number {
  const first = s.charCodeAt(0);
  const n = s.length;
  outer: for (let i = b.indexOf(first, from); i >= 0 && i + n <= b.length; i = b.indexOf(first, i + 1)) {
    for (let k = 1; k < n; k++) if (b[i + k] !== s.charCodeAt(k)) continue outer;
    return i;
  }
  return -1;
}

function zipKind(b: Uint8Array): FileType {
  if (indexOfAscii(b, "mimetypeapplication/vnd.oasis.opendocument.spreadsheet") >= 0) return "ods";
  if (indexOfAscii(b, "xl/workbook.xml") >= 0 || indexOfAscii(b, "xl/workbook.bin") >= 0) return "xlsx";
  if (indexOfAscii(b, "word/document.xml") >= 0) return "docx";
  if (indexOfAscii(b, "ppt/presentation.xml") >= 0) return "pptx";
  return "zip";
}

function sniff(b: Uint8Array): FileType | null {
  if (startsWith(b, [0x50, 0x4b, 0x03, 0x04]) || startsWith(b, [0x50, 0x4b, 0x05, 0x06])) return zipKind(b);
  if (startsWith(b, [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])) return "xls";
  if (startsWith(b, [0x1f, 0x8b])) return "gzip";
  if (startsWith(b, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return "png";
  if (startsWith(b, [0xff, 0xd8, 0xff])) return "jpeg";
  if (startsWith(b, ascii("GIF87a")) || startsWith(b, ascii("GIF89a"))) return "gif";
  if (startsWith(b, ascii("RIFF")) && startsWith(b, ascii("WEBP"), 8)) return "webp";
  if (startsWith(b, [0x49, 0x49, 0x2a, 0x00]) || startsWith(b, [0x4d, 0x4d, 0x00, 0x2a])) return "tiff";
  if (startsWith(b, ascii("BM")) && b.length > 26 && b[14] >= 12 && b[15] === 0 && b[16] === 0 && b[17] === 0) return "bmp";
  if (startsWith(b, ascii("%PDF-"))) return "pdf";
  if (startsWith(b, ascii("SQLite format 3\u0000"))) return "sqlite";
  if (startsWith(b, ascii("RDX2\n")) || startsWith(b, ascii("RDX3\n")) || startsWith(b, ascii("RDA2\n")) || startsWith(b, ascii("RDA3\n"))) return "rdata";
  // NUL bytes in the first kilobyte: not a text table (UTF-16 has its own message in the decoder).
  const head = b.subarray(0, Math.min(b.length, 1024));
  const utf16 = startsWith(b, [0xff, 0xfe]) || startsWith(b, [0xfe, 0xff]);
  if (!utf16 && head.indexOf(0) >= 0) return "binary";
  return null;
}

/** The file's type when its first bytes say it is not a text table; null for (possible) text. */
export function detectSignature(bytes: Uint8Array): FileSignature | null {
  const type = sniff(bytes);
  return type ? { type, what: WHAT[type] } : null;
}

/** Advice for a file that is not a table the parser reads. */
export function signatureAdvice(sig: FileSignature): string {
  switch (sig.type) {
    case "xlsx":
      return "workbooks are read by the upload (and by parseNetworkFile), or save the sheet as CSV (UTF-8)";
    case "xls":
    case "ods":
      return "save the sheet as .xlsx or as CSV (UTF-8) and upload that";
    case "zip":
      return "upload the zip under a name ending in .zip: its CSV, TSV or .xlsx files are read one network each";
    case "gzip":
    case "rdata":
      return "export the matrix from R with write.csv() and upload the CSV";
    default:
      return "upload the network as a CSV or TSV table, an .xlsx workbook, or a zip of such files";
  }
}

/**
 * The sum of the uncompressed sizes a zip's central directory declares (null when no central directory is
 * found), so a workbook that would expand past the size limit is refused before it is inflated.
 */
export function zipDeclaredSize(b: Uint8Array): number | null {
  // End of central directory: signature 0x06054b50, within the last 65,557 bytes.
  const min = Math.max(0, b.length - 65_557);
  let eocd = -1;
  for (let i = b.length - 22; i >= min; i--) {
    if (b[i] === 0x50 && b[i + 1] === 0x4b && b[i + 2] === 0x05 && b[i + 3] === 0x06) { eocd = i; break; }
  }
  if (eocd < 0) return null;
  const u16 = (p: number) => b[p] | (b[p + 1] << 8);
  const u32 = (p: number) => (b[p] | (b[p + 1] << 8) | (b[p + 2] << 16)) + b[p + 3] * 0x1000000;
  const entries = u16(eocd + 10);
  let p = u32(eocd + 16);
  let total = 0;
  for (let k = 0; k < entries; k++) {
    if (p + 46 > b.length || u32(p) !== 0x02014b50) return null;
    total += u32(p + 24);
    p += 46 + u16(p + 28) + u16(p + 30) + u16(p + 32);
  }
  return total;
}
