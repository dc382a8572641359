/**
 * Rules that JSON Schema cannot express because they compare fields or depend on the parsed network.
 * Run after the schema (server at submission, client on the forms); messages in the same FieldError form.
 */
import type { FieldError } from "./messages";

export interface NetworkFacts {
  kind: "bipartite" | "unipartite";
  directed: boolean;
}

export function networkCrossChecks(meta: Record<string, unknown>, facts: NetworkFacts): FieldError[] {
  const out: FieldError[] = [];
  const start = meta.startDate;
  const end = meta.endDate;
  if (typeof start === "string" && typeof end === "string" && /^\d{4}-\d{2}-\d{2}$/.test(start) && /^\d{4}-\d{2}-\d{2}$/.test(end) && end < start) {
    out.push({ path: "/endDate", message: `End date ${end} is before the start date ${start}.` });
  }
  const blank = (v: unknown) => typeof v !== "string" || v.trim() === "";
  if (facts.kind === "bipartite") {
    if (blank(meta.rowLevel)) out.push({ path: "/rowLevel", message: "Say what the row nodes are for a bipartite network, e.g. plants." });
    if (blank(meta.colLevel)) out.push({ path: "/colLevel", message: "Say what the column nodes are for a bipartite network, e.g. pollinators." });
  } else if (facts.directed && blank(meta.directionMeaning)) {
    out.push({ path: "/directionMeaning", message: "Direction meaning is required for a directed network: say what a link from row to column means, e.g. row eats column." });
  }
  return out;
}
