/**
 * The accessibility check every browser test runs: axe-core with the WCAG 2 A and AA rules over the page
 * (or the part named by `include`), answering the serious and critical violations as "rule: selectors" so
 * a failure says what to fix. An empty list means none.
 */
import { AxeBuilder } from "@axe-core/playwright";
import type { Page } from "playwright-core";

export async function axeSerious(page: Page, include?: string): Promise<string[]> {
  const builder = new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa"]);
  const result = await (include ? builder.include(include) : builder).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
}
