/**
 * A world outline drawn offline from the world-atlas package (Natural Earth 1:110m countries, shipped in the
 * app bundle; no tile server, no outside request) with d3-geo's Equal Earth projection, and points on it.
 * Points carry their own accessible names; the figure around the map supplies the text alternative.
 */
import { useEffect, useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from "react";
import { geoEqualEarth, geoGraticule10, geoMercator, geoPath } from "d3-geo";
import { feature, mesh } from "topojson-client";
import type { Topology, GeometryCollection } from "topojson-specification";
import type { FeatureCollection, MultiLineString } from "geojson";

export interface MapPoint {
  id: string;
  latitude: number;
  longitude: number;
  colour: string;
  title: string;
  href?: string;
  /** Networks at this site (a grouped marker: its area grows with the count, the count is written on it). */
  count?: number;
  /** The mix at the site, drawn as a ring of arcs around the marker (colour and number of networks). */
  mix?: Array<{ colour: string; n: number }>;
}

/** An arc of a ring between two angles (radians, clockwise from north). */
function ringArc(cx: number, cy: number, r: number, a0: number, a1: number): string {
  const p = (a: number) => `${(cx + r * Math.sin(a)).toFixed(2)},${(cy - r * Math.cos(a)).toFixed(2)}`;
  return `M${p(a0)}A${r},${r} 0 ${a1 - a0 > Math.PI ? 1 : 0} 1 ${p(a1)}`;
}

/** An area in degrees (GeoJSON bbox order); `west > east` crosses the antimeridian. */
export interface MapArea {
  west: number;
  south: number;
  east: number;
  north: number;
}

/** The area's outline as lon/lat points along its parallels and meridians (so it bends with the projection). */
function areaRing(a: MapArea): Array<[number, number]> {
  const east = a.west > a.east ? a.east + 360 : a.east;
  const steps = Math.max(2, Math.ceil((east - a.west) / 2));
  const ring: Array<[number, number]> = [];
  const wrap = (x: number) => (x > 180 ? x - 360 : x);
  for (let i = 0; i <= steps; i++) ring.push([wrap(a.west + ((east - a.west) * i) / steps), a.south]);
  const up = Math.max(2, Math.ceil((a.north - a.south) / 2));
  for (let i = 0; i <= up; i++) ring.push([wrap(east), a.south + ((a.north - a.south) * i) / up]);
  for (let i = steps; i >= 0; i--) ring.push([wrap(a.west + ((east - a.west) * i) / steps), a.north]);
  for (let i = up; i >= 0; i--) ring.push([a.west, a.south + ((a.north - a.south) * i) / up]);
  return ring;
}

interface Outline {
  land: FeatureCollection;
  borders: MultiLineString;
}

let outlinePromise: Promise<Outline> | null = null;
function loadOutline(): Promise<Outline> {
  outlinePromise ??= import("world-atlas/countries-110m.json").then((m) => {
    const topo = (m.default ?? m) as unknown as Topology<{
      countries: GeometryCollection;
    }>;
    return {
      land: feature(
        topo,
        topo.objects.countries,
      ) as unknown as FeatureCollection,
      borders: mesh(
        topo,
        topo.objects.countries,
        (a, b) => a !== b,
      ) as MultiLineString,
    };
  });
  return outlinePromise;
}

/**
 * `region`: instead of the whole world, a Mercator view around the points, at least `region` degrees
 * across (a locator map that shows the surrounding coastlines and borders).
 */
export function WorldMap({
  points,
  width = 960,
  label,
  radius = 4,
  onPointActivate,
  region,
  area,
  drawing = false,
  onAreaDrawn,
}: {
  points: MapPoint[];
  width?: number;
  label: string;
  radius?: number;
  onPointActivate?: (p: MapPoint) => void;
  region?: number;
  /** An area to outline on the map. */
  area?: MapArea | null;
  /** While true, dragging over the map draws an area, handed to onAreaDrawn in degrees. */
  drawing?: boolean;
  onAreaDrawn?: (a: MapArea) => void;
}) {
  const svgRef = useRef<SVGSVGElement>(null);
  const [drag, setDrag] = useState<{ x0: number; y0: number; x1: number; y1: number } | null>(null);
  const [outline, setOutline] = useState<Outline | null>(null);
  useEffect(() => {
    let live = true;
    void loadOutline().then((o) => live && setOutline(o));
    return () => {
      live = false;
    };
  }, []);
  const height = Math.round(width * (region ? 0.75 : 0.487));
  // with links inside, the map is a group of links (an image may not contain interactive parts)
  const interactive = points.some((p) => p.href) || !!onPointActivate;
  const { path, projection } = useMemo(() => {
    if (region && points.length) {
      const lats = points.map((p) => p.latitude);
      const lons = points.map((p) => p.longitude);
      const half = region / 2;
      const clampLat = (v: number) => Math.max(-80, Math.min(80, v));
      const box = {
        type: "MultiPoint" as const,
        coordinates: [
          [Math.min(...lons) - half, clampLat(Math.min(...lats) - half / 2)],
          [Math.max(...lons) + half, clampLat(Math.max(...lats) + half / 2)],
        ],
      };
      const projection = geoMercator().fitExtent(
        [
          [8, 8],
          [width - 8, height - 8],
        ],
        box,
      );
      return { projection, path: geoPath(projection) };
    }
    const projection = geoEqualEarth().fitSize([width, height], {
      type: "Sphere",
    });
    return { projection, path: geoPath(projection) };
  }, [width, height, region, points]);
  const toSvg = (e: ReactPointerEvent): [number, number] => {
    const m = svgRef.current?.getScreenCTM();
    if (!m) return [0, 0];
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(m.inverse());
    return [Math.max(0, Math.min(width, p.x)), Math.max(0, Math.min(height, p.y))];
  };
  /** The lon/lat bounds of a dragged screen rectangle: its edges sampled and un-projected. */
  const finish = (d: { x0: number; y0: number; x1: number; y1: number }) => {
    const [xa, xb] = [Math.min(d.x0, d.x1), Math.max(d.x0, d.x1)];
    const [ya, yb] = [Math.min(d.y0, d.y1), Math.max(d.y0, d.y1)];
    if (xb - xa < 4 || yb - ya < 4 || !projection.invert) return;
    const lons: number[] = [];
    const lats: number[] = [];
    for (let i = 0; i <= 24; i++) {
      for (const [x, y] of [
        [xa + ((xb - xa) * i) / 24, ya],
        [xa + ((xb - xa) * i) / 24, yb],
        [xa, ya + ((yb - ya) * i) / 24],
        [xb, ya + ((yb - ya) * i) / 24],
      ]) {
        const ll = projection.invert([x, y]);
        if (!ll || !Number.isFinite(ll[0]) || !Number.isFinite(ll[1]) || Math.abs(ll[0]) > 180.0001 || Math.abs(ll[1]) > 90.0001) continue;
        lons.push(ll[0]);
        lats.push(ll[1]);
      }
    }
    if (!lons.length) return;
    const r = (v: number) => Math.round(v * 100) / 100;
    onAreaDrawn?.({ west: r(Math.max(-180, Math.min(...lons))), south: r(Math.max(-90, Math.min(...lats))), east: r(Math.min(180, Math.max(...lons))), north: r(Math.min(90, Math.max(...lats))) });
  };
  const areaPath = area
    ? areaRing(area)
        .map((ll) => projection(ll))
        .filter((xy): xy is [number, number] => !!xy)
        .map(([x, y], i) => `${i ? "L" : "M"}${x.toFixed(1)},${y.toFixed(1)}`)
        .join("") + "Z"
    : null;
  return (
    <svg
      ref={svgRef}
      viewBox={`0 0 ${width} ${height}`}
      className="h-auto w-full"
      role={interactive ? "group" : "img"}
      aria-label={label}
      data-map-ready={outline ? "true" : "false"}
    >
      <defs>
        <clipPath id={`clip-${width}-${height}`}>
          <rect width={width} height={height} />
        </clipPath>
      </defs>
      <g clipPath={`url(#clip-${width}-${height})`}>
        {region ? (
          <rect width={width} height={height} fill="#eaf2f7" stroke="#a8a29e" />
        ) : (
          <path
            d={path({ type: "Sphere" }) ?? ""}
            fill="#eaf2f7"
            stroke="#a8a29e"
          />
        )}
        <path
          d={path(geoGraticule10()) ?? ""}
          fill="none"
          stroke="#d6d3d1"
          strokeWidth={0.5}
        />
        {outline && (
          <>
            <path d={path(outline.land) ?? ""} fill="#e7e5e4" stroke="none" />
            <path
              d={path(outline.borders) ?? ""}
              fill="none"
              stroke="#a8a29e"
              strokeWidth={0.5}
            />
          </>
        )}
      </g>
      {points.map((p) => {
        const xy = projection([p.longitude, p.latitude]);
        if (!xy) return null;
        const count = p.count ?? 1;
        // area proportional to the number of networks at the site (radius grows with its square root)
        const r = count > 1 ? Math.min(radius * 6, radius * (1 + Math.sqrt(count - 1) * 0.9)) : radius;
        const total = p.mix?.reduce((t, m) => t + m.n, 0) ?? 0;
        let angle = 0;
        const dot = (
          <g data-site-count={count}>
            <circle cx={xy[0]} cy={xy[1]} r={r} fill={p.mix && p.mix.length > 1 ? "#fafaf9" : p.colour} fillOpacity={0.9} stroke="#1c1917" strokeWidth={0.8}>
              <title>{p.title}</title>
            </circle>
            {p.mix &&
              p.mix.length > 1 &&
              p.mix.map((m) => {
                const a0 = angle;
                angle += (2 * Math.PI * m.n) / total;
                return <path key={m.colour} d={ringArc(xy[0], xy[1], r - 1.6, a0, angle - 0.0001)} fill="none" stroke={m.colour} strokeWidth={3.2} pointerEvents="none" />;
              })}
            {count > 1 && (
              <text x={xy[0]} y={xy[1]} dy="0.35em" textAnchor="middle" fontSize={Math.max(8, r * 0.9)} fontWeight={700} fill={p.mix && p.mix.length > 1 ? "#1c1917" : "#ffffff"} pointerEvents="none" aria-hidden="true">
                {count}
              </text>
            )}
          </g>
        );
        return p.href || onPointActivate ? (
          <a
            key={p.id}
            href={p.href}
            aria-label={p.title}
            onClick={(e) => {
              if (onPointActivate) {
                e.preventDefault();
                onPointActivate(p);
              }
            }}
          >
            {dot}
          </a>
        ) : (
          <g key={p.id}>{dot}</g>
        );
      })}
      {areaPath && <path d={areaPath} fill="#b88a1c" fillOpacity={0.12} stroke="#b88a1c" strokeWidth={2} strokeDasharray="6 3" data-testid="map-area" pointerEvents="none" />}
      {drawing && (
        <rect
          width={width}
          height={height}
          fill="#000"
          fillOpacity={0}
          pointerEvents="all"
          style={{ cursor: "crosshair", touchAction: "none" }}
          data-testid="map-draw-surface"
          onPointerDown={(e) => {
            e.currentTarget.setPointerCapture(e.pointerId);
            const [x, y] = toSvg(e);
            setDrag({ x0: x, y0: y, x1: x, y1: y });
          }}
          onPointerMove={(e) => {
            if (!drag) return;
            const [x, y] = toSvg(e);
            setDrag({ ...drag, x1: x, y1: y });
          }}
          onPointerUp={() => {
            if (drag) finish(drag);
            setDrag(null);
          }}
        />
      )}
      {drag && (
        <rect
          x={Math.min(drag.x0, drag.x1)}
          y={Math.min(drag.y0, drag.y1)}
          width={Math.abs(drag.x1 - drag.x0)}
          height={Math.abs(drag.y1 - drag.y0)}
          fill="#b88a1c"
          fillOpacity={0.15}
          stroke="#b88a1c"
          strokeWidth={1.5}
          pointerEvents="none"
        />
      )}
    </svg>
  );
}
