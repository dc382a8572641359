/** A histogram of values (d3.bin) with an optional marked value, e.g. the null distribution of Q with the observed Q. */
import { bin, extent, max } from "d3-array";
import { scaleLinear } from "d3-scale";
import { BottomAxis, GridY, LeftAxis } from "./axes";
import { chartTheme } from "./theme";

export interface HistogramProps {
  values: number[];
  marker?: { value: number; label: string };
  xLabel: string;
  yLabel: string;
  width?: number;
  height?: number;
  /** accessible name of the image */
  label: string;
  bins?: number;
}

export function Histogram({ values, marker, xLabel, yLabel, width = 640, height = 300, label, bins = 20 }: HistogramProps) {
  const m = chartTheme.margin;
  const [lo0, hi0] = extent(values) as [number, number];
  let lo = Math.min(lo0, marker?.value ?? lo0);
  let hi = Math.max(hi0, marker?.value ?? hi0);
  if (lo === hi) {
    lo -= 0.01;
    hi += 0.01;
  }
  const pad = (hi - lo) * 0.05;
  const x = scaleLinear().domain([lo - pad, hi + pad]).nice().range([m.left, width - m.right]);
  const binned = bin().domain(x.domain() as [number, number]).thresholds(x.ticks(bins))(values);
  const y = scaleLinear().domain([0, max(binned, (b) => b.length) ?? 1]).nice().range([height - m.bottom, m.top + 14]);
  return (
    <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full max-w-3xl" role="img" aria-label={label}>
      <GridY scale={y} x0={m.left} x1={width - m.right} />
      <g fill={chartTheme.markLight} stroke={chartTheme.mark} strokeWidth={0.8}>
        {binned.map((b, i) =>
          b.length ? <rect key={i} x={x(b.x0!) + 0.5} y={y(b.length)} width={Math.max(0, x(b.x1!) - x(b.x0!) - 1)} height={y(0) - y(b.length)} /> : null,
        )}
      </g>
      <BottomAxis scale={x} offset={height - m.bottom} length={width - m.left - m.right} label={xLabel} />
      <LeftAxis scale={y} offset={m.left} length={height - m.top - m.bottom} label={yLabel} format={(v) => String(v)} />
      {marker && (
        <g>
          <line x1={x(marker.value)} x2={x(marker.value)} y1={m.top + 10} y2={height - m.bottom} stroke={chartTheme.accentStrong} strokeWidth={2.5} strokeDasharray="6 3" />
          <text
            x={x(marker.value)}
            y={m.top + 4}
            textAnchor={x(marker.value) > width * 0.7 ? "end" : "start"}
            dx={x(marker.value) > width * 0.7 ? -4 : 4}
            fontFamily={chartTheme.font}
            fontSize={chartTheme.fontSize}
            fontWeight={700}
            fill={chartTheme.accentStrong}
          >
            {marker.label}
          </text>
        </g>
      )}
    </svg>
  );
}
