/** Content type of a stored original network file, from what its bytes are (a workbook may be named .csv). */
import { detectSignature } from "@shared/network/parse/signature";

export function originalFileType(name: string, bytes: Uint8Array): string {
  const sig = detectSignature(bytes);
  if (sig?.type === "xlsx") return "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";
  if (sig) return "application/octet-stream";
  return /\.tsv$/i.test(name) ? "text/tab-separated-values" : "text/csv";
}
