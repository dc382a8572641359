/** Axes drawn from d3 scales: ticks, tick labels and an axis title that names the quantity and its unit. */
import type { ScaleLinear } from "d3-scale";
import { chartTheme } from "./theme";

interface AxisProps {
  scale: ScaleLinear<number, number>;
  /** distance from the plot's top (bottom axis) or left (left axis) edge */
  offset: number;
  length: number;
  label: string;
  ticks?: number;
  format?: (v: number) => string;
}

export function BottomAxis({ scale, offset, length, label, ticks = 6, format }: AxisProps) {
  const fmt = format ?? scale.tickFormat(ticks);
  const [r0, r1] = scale.range();
  return (
    <g transform={`translate(0,${offset})`} fontFamily={chartTheme.font} fontSize={chartTheme.fontSize} fill={chartTheme.text}>
      <line x1={r0} x2={r1} stroke={chartTheme.axis} />
      {scale.ticks(ticks).map((t) => (
        <g key={t} transform={`translate(${scale(t)},0)`}>
          <line y2={5} stroke={chartTheme.axis} />
          <text y={18} textAnchor="middle">
            {fmt(t)}
          </text>
        </g>
      ))}
      <text x={(r0 + r1) / 2} y={40} textAnchor="middle" fontWeight={600}>
        {label}
      </text>
      <desc>{`${label}, from ${fmt(scale.domain()[0])} to ${fmt(scale.domain()[1])}; ${length}px`}</desc>
    </g>
  );
}

export function LeftAxis({ scale, offset, label, ticks = 5, format }: AxisProps) {
  const fmt = format ?? scale.tickFormat(ticks);
  const [r0, r1] = scale.range();
  return (
    <g transform={`translate(${offset},0)`} fontFamily={chartTheme.font} fontSize={chartTheme.fontSize} fill={chartTheme.text}>
      <line y1={r0} y2={r1} stroke={chartTheme.axis} />
      {scale.ticks(ticks).map((t) => (
        <g key={t} transform={`translate(0,${scale(t)})`}>
          <line x2={-5} stroke={chartTheme.axis} />
          <text x={-8} dy="0.32em" textAnchor="end">
            {fmt(t)}
          </text>
        </g>
      ))}
      <text transform={`translate(-48,${(r0 + r1) / 2}) rotate(-90)`} textAnchor="middle" fontWeight={600}>
        {label}
      </text>
    </g>
  );
}

/** Light horizontal grid lines at the left axis ticks. */
export function GridY({ scale, x0, x1, ticks = 5 }: { scale: ScaleLinear<number, number>; x0: number; x1: number; ticks?: number }) {
  return (
    <g aria-hidden="true">
      {scale.ticks(ticks).map((t) => (
        <line key={t} x1={x0} x2={x1} y1={scale(t)} y2={scale(t)} stroke={chartTheme.grid} />
      ))}
    </g>
  );
}
