/** Address parts of the network-view routes; a malformed address is a 404 (no such page). */
import { ApiError } from "../../lib/api-error";

export function parsePosition(s: string): number {
  if (!/^\d{1,6}$/.test(s) || Number(s) < 1) throw ApiError.notFound(`No network "${s}": networks are numbered from 1.`);
  return Number(s);
}
