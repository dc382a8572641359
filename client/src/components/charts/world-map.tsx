/**
 * A world outline drawn offline from the world-atlas package (Natural Earth 1:110m countries, shipped in the
 * app bundle; no tile server, no outside request) with d3-geo's Equal Earth projection, and points on it.
 * Points carry their own accessible names; the figure around the map supplies the text alternative.
 */
import { useEffect, useMemo, useState } from "react";
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
}: {
  points: MapPoint[];
  width?: number;
  label: string;
  radius?: number;
  onPointActivate?: (p: MapPoint) => void;
  region?: number;
}) {
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
  return (
    <svg
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
        const dot = (
          <circle
            cx={xy[0]}
            cy={xy[1]}
            r={radius}
            fill={p.colour}
            fillOpacity={0.85}
            stroke="#1c1917"
            strokeWidth={0.8}
          >
            <title>{p.title}</title>
          </circle>
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
    </svg>
  );
}
