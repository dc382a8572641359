/**
 * Node roles (Guimerà & Amaral 2005): participation coefficient P against within-module degree z, with the
 * thresholds of Olesen et al. 2007 (z = 2.5, P = 0.62) and the four role regions labelled.
 */
import type { NetworkView } from "@shared/types/network-view";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Legend } from "../../../components/charts/legend";
import { Scatter, type ScatterPoint } from "../../../components/charts/scatter";
import { categoryColour } from "../../../components/charts/theme";
import { fmt } from "../utils/format";
import { RESOLUTION_LIMIT_CAUTION } from "../../../components/figures/significance";

const ROLE_LABEL: Record<string, string> = { peripheral: "peripheral", connector: "connector", "module-hub": "module hub", "network-hub": "network hub" };

export function RolesPlot({ view }: { view: NetworkView }) {
  if (!view.roles || !view.roleThresholds) {
    return (
      <section className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h3 className="font-bold text-moss-700">Node roles</h3>
        <p className="mt-2 text-stone-700">Appears when the metrics run has finished.</p>
      </section>
    );
  }
  const t = view.roleThresholds;
  const bip = view.kind === "bipartite";
  const levelName = (l: string | null) => (l === "row" ? (view.metadata.rowLevel ?? "rows") : l === "col" ? (view.metadata.colLevel ?? "columns") : "nodes");
  const plotted = view.roles.filter((r) => r.z !== null && r.P !== null);
  const undefinedZ = view.roles.length - plotted.length;
  const points: ScatterPoint[] = plotted.map((r) => ({
    id: `${r.level}:${r.label}`,
    x: r.P!,
    y: r.z!,
    colour: bip && r.level === "col" ? categoryColour(1) : categoryColour(0),
    title: `${r.label} (${levelName(r.level)}, module ${r.module + 1}): P = ${fmt(r.P, 2)}, z = ${fmt(r.z, 2)}, ${ROLE_LABEL[r.role ?? ""] ?? "no role"}`,
  }));
  const counts = new Map<string, number>();
  // Counted over the plotted points only, so the caption's counts add up to the points shown.
  for (const r of plotted) if (r.role) counts.set(r.role, (counts.get(r.role) ?? 0) + 1);
  const zs = plotted.map((r) => r.z!);
  const yMax = Math.max(t.z + 1, ...zs);
  const yMin = Math.min(-2, ...zs);
  return (
    <ChartFigure
      id="roles"
      download={`tanglebank-${view.ref.replace(/\//g, "-")}-roles`}
      title="Node roles: participation P against within-module degree z"
      caption={
        <>
          {plotted.length} nodes plotted
          {undefinedZ > 0 && ` (${undefinedZ} left out and given no role: z is undefined for isolated nodes and when every node of its group has the same within-module degree)`}. Thresholds z = {t.z} and P = {t.p} (Olesen et al. 2007)
          split them: {["peripheral", "connector", "module-hub", "network-hub"].map((r) => `${counts.get(r) ?? 0} ${ROLE_LABEL[r]}s`).join(", ")}.
          {" "}z uses the sample standard deviation (n − 1) of the within-module {view.weighted ? "strengths (the weights the partition was optimized with)" : "degrees (link counts)"}
          {bip ? ", computed among the nodes of the same level in each module; P from the modules of its links." : "; P from the modules of its links."} {RESOLUTION_LIMIT_CAUTION}
        </>
      }
      table={{
        caption: "Node roles",
        columns: ["node", "side", "module", "degree", "z", "P", "role"],
        rows: view.roles.map((r) => [r.label, levelName(r.level), r.module + 1, r.degree, fmt(r.z, 3), fmt(r.P, 3), ROLE_LABEL[r.role ?? ""] ?? "—"]),
      }}
    >
      <Scatter
        points={points}
        xLabel="Participation coefficient P (0–1)"
        yLabel="Within-module degree z (sd units)"
        label={`Roles plot of ${plotted.length} nodes with thresholds z = ${t.z} and P = ${t.p}`}
        xDomain={[0, 1]}
        yDomain={[yMin, yMax]}
        vLines={[{ x: t.p, label: `P = ${t.p}` }]}
        hLines={[{ y: t.z, label: `z = ${t.z}` }]}
        regions={[
          { x: t.p / 2, y: yMin + 0.4, text: "peripherals" },
          { x: (1 + t.p) / 2, y: yMin + 0.4, text: "connectors" },
          { x: t.p / 2, y: yMax - 0.35, text: "module hubs" },
          { x: (1 + t.p) / 2, y: yMax - 0.35, text: "network hubs" },
        ]}
        radius={points.length > 2000 ? 2 : 4}
        width={640}
        height={400}
      />
      {bip && (
        <Legend
          items={[
            { label: view.metadata.rowLevel ?? "rows", colour: categoryColour(0) },
            { label: view.metadata.colLevel ?? "columns", colour: categoryColour(1) },
          ]}
        />
      )}
    </ChartFigure>
  );
}
