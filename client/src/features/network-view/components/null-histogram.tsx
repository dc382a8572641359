import type { NetworkView } from "../../../../../shared/types/network-view";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Histogram } from "../../../components/charts/histogram";
import { Legend } from "../../../components/charts/legend";
import { chartTheme } from "../../../components/charts/theme";
import { fmt, fmtP, nullModelName } from "../utils/format";

export function NullHistogram({ view }: { view: NetworkView }) {
  const m = view.metrics;
  if (!view.nullQs || !view.nullQs.length || m.Q === null || m.Q === undefined) {
    return (
      <section className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h3 className="font-bold text-moss-700">Null distribution of modularity</h3>
        <p className="mt-2 text-stone-700">
          {m.status === "succeeded" ? "The Q values of the null networks were not kept for this run." : "Appears when the metrics run has finished."}
        </p>
      </section>
    );
  }
  const sorted = [...view.nullQs].sort((a, b) => a - b);
  const qName = m.objective === "barber" ? "Q_B" : "Q";
  return (
    <ChartFigure
      id="null-hist"
      title="Null distribution of modularity"
      caption={
        <>
          Optimized {qName} of {view.nullQs.length} null networks ({nullModelName[m.nullModel ?? ""] ?? m.nullModel}), ranging from {fmt(sorted[0], 4)} to{" "}
          {fmt(sorted[sorted.length - 1], 4)} (mean {fmt(m.nullMean, 4)}, sd {fmt(m.nullSd, 4)}). The observed {qName} = {fmt(m.Q, 4)} is marked: z = {fmt(m.z, 2)}, p ={" "}
          {fmtP(m.p)}.
        </>
      }
      table={{ caption: "Null Q values, sorted", columns: ["#", `null ${qName}`], rows: sorted.map((q, i) => [i + 1, q.toFixed(5)]) }}
    >
      <Histogram
        values={view.nullQs}
        marker={{ value: m.Q, label: `observed ${qName} = ${fmt(m.Q, 3)}` }}
        xLabel={`Optimized modularity ${qName} (unitless)`}
        yLabel="Null networks (count)"
        label={`Histogram of ${view.nullQs.length} null modularity values with the observed value marked`}
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
