/**
 * A scatter plot on d3 linear scales, with optional reference lines and region labels. Points are
 * coloured by group; with `focusable`, each point is reachable by Tab and names itself (for small sets).
 */
import { forwardRef } from "react";
import { extent } from "d3-array";
import { scaleLinear } from "d3-scale";
import { BottomAxis, GridY, LeftAxis } from "./axes";
import { chartTheme } from "./theme";

export interface ScatterPoint {
  id: string;
  x: number;
  y: number;
  colour: string;
  /** text for the tooltip and accessible name */
  title: string;
}

export interface ScatterProps {
  points: ScatterPoint[];
  xLabel: string;
  yLabel: string;
  label: string;
  width?: number;
  height?: number;
  xDomain?: [number, number];
  yDomain?: [number, number];
  vLines?: Array<{ x: number; label: string }>;
  hLines?: Array<{ y: number; label: string }>;
  regions?: Array<{ x: number; y: number; text: string; anchor?: "start" | "end" | "middle" }>;
  focusable?: boolean;
  radius?: number;
  title?: string;
}

function padded(d: [number, number]): [number, number] {
  if (d[0] === d[1]) return [d[0] - 1, d[1] + 1];
  const p = (d[1] - d[0]) * 0.06;
  return [d[0] - p, d[1] + p];
}

export const Scatter = forwardRef<SVGSVGElement, ScatterProps>(function Scatter(
  { points, xLabel, yLabel, label, width = 560, height = 360, xDomain, yDomain, vLines = [], hLines = [], regions = [], focusable = false, radius = 4, title },
  ref,
) {
  const m = chartTheme.margin;
  const xs = [...points.map((p) => p.x), ...vLines.map((l) => l.x)];
  const ys = [...points.map((p) => p.y), ...hLines.map((l) => l.y)];
  const x = scaleLinear()
    .domain(xDomain ?? padded((extent(xs) as [number, number])[0] === undefined ? [0, 1] : (extent(xs) as [number, number])))
    .nice()
    .range([m.left, width - m.right]);
  const y = scaleLinear()
    .domain(yDomain ?? padded((extent(ys) as [number, number])[0] === undefined ? [0, 1] : (extent(ys) as [number, number])))
    .nice()
    .range([height - m.bottom, m.top]);
  const [x0, x1] = x.range();
  const [y0, y1] = y.range();
  return (
    <svg ref={ref} xmlns="http://www.w3.org/2000/svg" viewBox={`0 0 ${width} ${height}`} className="h-auto w-full" role={focusable ? "group" : "img"} aria-label={label}>
      {title && <title>{title}</title>}
      <rect x={0} y={0} width={width} height={height} fill="#ffffff" />
      <GridY scale={y} x0={x0} x1={x1} />
      <BottomAxis scale={x} offset={y0} length={x1 - x0} label={xLabel} />
      <LeftAxis scale={y} offset={x0} length={y0 - y1} label={yLabel} />
      {vLines.map((l) => (
        <g key={`v${l.label}`}>
          <line x1={x(l.x)} x2={x(l.x)} y1={y1} y2={y0} stroke={chartTheme.accentStrong} strokeDasharray="5 3" strokeWidth={1.5} />
          <text x={x(l.x) + 4} y={y1 + 12} fontFamily={chartTheme.font} fontSize={11} fill={chartTheme.accentStrong}>
            {l.label}
          </text>
        </g>
      ))}
      {hLines.map((l) => (
        <g key={`h${l.label}`}>
          <line x1={x0} x2={x1} y1={y(l.y)} y2={y(l.y)} stroke={chartTheme.accentStrong} strokeDasharray="5 3" strokeWidth={1.5} />
          <text x={x1 - 4} y={y(l.y) - 4} textAnchor="end" fontFamily={chartTheme.font} fontSize={11} fill={chartTheme.accentStrong}>
            {l.label}
          </text>
        </g>
      ))}
      {regions.map((r) => (
        <text key={r.text} x={x(r.x)} y={y(r.y)} textAnchor={r.anchor ?? "middle"} fontFamily={chartTheme.font} fontSize={12} fontStyle="italic" fill="#44403c">
          {r.text}
        </text>
      ))}
      <g>
        {points.map((p) =>
          focusable ? (
            <circle key={p.id} cx={x(p.x)} cy={y(p.y)} r={radius + 1} fill={p.colour} stroke="#fff" strokeWidth={1} tabIndex={0} role="img" aria-label={p.title} className="focus:outline-none focus-visible:stroke-black focus-visible:stroke-[3px]">
              <title>{p.title}</title>
            </circle>
          ) : (
            <circle key={p.id} cx={x(p.x)} cy={y(p.y)} r={radius} fill={p.colour} fillOpacity={0.75} stroke="#fff" strokeWidth={0.5}>
              {/* tooltips for moderate sets only; large sets rely on the figure's data table */}
              {points.length <= 2000 && <title>{p.title}</title>}
            </circle>
          ),
        )}
      </g>
    </svg>
  );
});
