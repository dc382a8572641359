import type { NetworkView } from "@shared/types/network-view";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Histogram } from "../../../components/charts/histogram";
import { Legend } from "../../../components/charts/legend";
import { chartTheme } from "../../../components/charts/theme";
import { useState } from "react";
import { fmt } from "../utils/format";
import { NullBadge, fmtPFloor, fmtZ, nullLabel } from "../../../components/figures/significance";

/** The optimized Q of the null networks of one null model (primary first; buttons switch model), the observed Q marked. */
export function NullHistogram({ view }: { view: NetworkView }) {
  const m = view.metrics;
  const byModel = view.nullQsByModel ?? (view.nullQs && m.nullModel ? { [m.nullModel]: view.nullQs } : {});
  const models = (m.nulls ?? []).map((f) => f.model).filter((x) => byModel[x]?.length);
  const [chosen, setChosen] = useState<string | null>(null);
  const model = chosen && models.includes(chosen) ? chosen : models[0];
  const values = model ? byModel[model] : null;
  const fig = m.nulls?.find((f) => f.model === model);
  if (!values || !values.length || !fig || m.Q === null || m.Q === undefined) {
    return (
      <section className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h3 className="font-bold text-moss-700">Null distribution of modularity</h3>
        <p className="mt-2 text-stone-700">
          {m.status === "succeeded" ? "The Q values of the null networks were not kept for this run." : "Appears when the metrics run has finished."}
        </p>
      </section>
    );
  }
  const sorted = [...values].sort((a, b) => a - b);
  const qName = m.objective === "barber" ? "Q_B" : "Q";
  return (
    <ChartFigure
      id="null-hist"
      download={`tanglebank-${view.ref.replace(/\//g, "-")}-null-q-${model}`}
      title={`Null distribution of modularity: ${nullLabel(model)}`}
      caption={
        <>
          Optimized {qName} of {values.length} null networks of the null model {nullLabel(model)}
          <NullBadge model={model} primary={fig.primary} withTitle={false} />, ranging from {fmt(sorted[0], 4)} to {fmt(sorted[sorted.length - 1], 4)} (mean {fmt(fig.mean, 4)}, sd{" "}
          {fmt(fig.sd, 4)}). The observed {qName} = {fmt(m.Q, 4)} is marked: z = {fmtZ(fig.z, fig.zSe)}, p {fig.pAtFloor ? "" : "= "}{fmtPFloor(fig.p, fig.pAtFloor)} against this model.
        </>
      }
      table={{ caption: `Null Q values of ${nullLabel(model)}, sorted`, columns: ["#", `null ${qName}`], rows: sorted.map((q, i) => [i + 1, q.toFixed(5)]) }}
    >
      {models.length > 1 && (
        <div role="group" aria-label="Null model of the histogram" className="mb-2 flex flex-wrap gap-2">
          {models.map((x) => (
            <button
              key={x}
              type="button"
              aria-pressed={x === model}
              onClick={() => setChosen(x)}
              className={`rounded border px-2 py-1 text-xs ${x === model ? "border-moss-700 bg-moss-700 text-white" : "border-stone-300 bg-white text-stone-800"}`}
            >
              {nullLabel(x)}
            </button>
          ))}
        </div>
      )}
      <Histogram
        values={values}
        marker={{ value: m.Q, label: `observed ${qName} = ${fmt(m.Q, 3)}` }}
        xLabel={`Optimized modularity ${qName} (unitless)`}
        yLabel={`Null networks, ${nullLabel(model)} (count)`}
        label={`Histogram of ${values.length} null modularity values of ${nullLabel(model)} with the observed value marked`}
      />
      <Legend
        items={[
          { label: "Null networks", colour: chartTheme.markLight, shape: "square" },
          { label: `Observed ${qName}`, colour: chartTheme.accentStrong, shape: "line" },
        ]}
      />
    </ChartFigure>
  );
}
