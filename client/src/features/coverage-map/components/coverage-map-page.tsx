/**
 * /map — every catalogue network matching the filters in the URL (the catalogue's own parameters) on the
 * shipped world outline, so that geographic gaps show at a glance. An area (bbox) is drawn by dragging over
 * the map or typed as four edges; it filters the map and goes with the link to the catalogue.
 */
import { useMemo, useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { paths } from "../../../config/paths";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { Legend } from "../../../components/charts/legend";
import { WorldMap, type MapArea, type MapPoint } from "../../../components/charts/world-map";
import { interactionTypeColour, interactionTypeLabel } from "../../../components/charts/theme";
import { useMapPoints } from "../api/get-map-points";

const FILTER_NAMES: Record<string, string> = {
  q: "search",
  interactionType: "interaction type",
  kind: "kind",
  weighted: "weighted",
  habitat: "habitat",
  country: "country",
  licence: "licence",
  yearMin: "from year",
  yearMax: "to year",
  nodesMin: "min nodes",
  nodesMax: "max nodes",
  connectanceMin: "min C",
  connectanceMax: "max C",
  qMin: "min Q",
  qMax: "max Q",
  zMin: "min z",
  zMax: "max z",
  pMin: "min p",
  pMax: "max p",
  nullModel: "null model",
  continent: "continent",
  latitudeMin: "min latitude",
  latitudeMax: "max latitude",
  elevationMin: "min elevation (m)",
  elevationMax: "max elevation (m)",
  bbox: "area (W,S,E,N)",
};

function parseArea(v: string | null): MapArea | null {
  const parts = (v ?? "").split(",").map(Number);
  if (parts.length !== 4 || parts.some((n) => !Number.isFinite(n))) return null;
  const [west, south, east, north] = parts;
  return { west, south, east, north };
}

/** The area as four numbers, typed or drawn; applied to the URL (so the catalogue link carries it). */
function AreaPanel({ area, drawing, onDrawing, onApply }: { area: MapArea | null; drawing: boolean; onDrawing: (on: boolean) => void; onApply: (a: MapArea | null) => void }) {
  const [problem, setProblem] = useState<string | null>(null);
  const sides = [
    ["west", "West (longitude)"],
    ["south", "South (latitude)"],
    ["east", "East (longitude)"],
    ["north", "North (latitude)"],
  ] as const;
  return (
    <form
      key={area ? `${area.west},${area.south},${area.east},${area.north}` : "none"}
      aria-label="Area"
      className="mt-3 flex flex-wrap items-end gap-3 border-t border-stone-200 pt-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const v = Object.fromEntries(sides.map(([k]) => [k, Number(String(f.get(k) ?? "").trim() || NaN)])) as unknown as MapArea;
        if (sides.some(([k]) => !Number.isFinite(v[k]))) return setProblem("Give all four edges in degrees, or draw the area on the map.");
        if (Math.abs(v.west) > 180 || Math.abs(v.east) > 180) return setProblem("Longitudes lie between −180 and 180.");
        if (Math.abs(v.south) > 90 || Math.abs(v.north) > 90) return setProblem("Latitudes lie between −90 and 90.");
        if (v.south > v.north) return setProblem(`The south edge (${v.south}) is north of the north edge (${v.north}).`);
        setProblem(null);
        onApply(v);
      }}
    >
      <p className="w-full text-sm text-stone-700">
        Choose an area by dragging over the map after “Draw an area”, or type its edges (degrees; south and west negative; a west edge greater than the east edge
        crosses the 180° meridian). The area is matched against the public coordinates, which are generalised for sensitive sites.
      </p>
      {sides.map(([k, label]) => (
        <label key={k} className="text-sm font-semibold text-stone-800">
          {label}
          <input
            name={k}
            type="number"
            step="any"
            defaultValue={area ? String(area[k]) : ""}
            aria-invalid={problem ? true : undefined}
            className="mt-1 block w-28 rounded border border-stone-400 px-2 py-1 font-normal"
          />
        </label>
      ))}
      <button type="submit" className="rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
        Apply area
      </button>
      <button
        type="button"
        aria-pressed={drawing}
        className={`rounded px-3 py-1.5 text-sm font-semibold ${drawing ? "bg-lichen-600 text-white" : "border border-moss-700 text-moss-700 hover:bg-moss-50"}`}
        onClick={() => onDrawing(!drawing)}
      >
        {drawing ? "Drawing: drag over the map" : "Draw an area"}
      </button>
      {area && (
        <button type="button" className="text-sm font-semibold text-stone-700 underline" onClick={() => onApply(null)}>
          Clear area
        </button>
      )}
      {problem && (
        <p role="alert" className="w-full text-sm font-semibold text-red-800">
          {problem}
        </p>
      )}
    </form>
  );
}

export function CoverageMapPage() {
  const [params, setParams] = useSearchParams();
  const filters = useMemo(() => {
    const p = new URLSearchParams();
    for (const [k, v] of params) if (k in FILTER_NAMES && v) p.append(k, v);
    return p;
  }, [params]);
  const query = filters.toString();
  const q = useMapPoints(query);
  const rows = useMemo(() => q.data?.data ?? [], [q.data]);
  // one marker per site (networks at the same public coordinates), sized by how many networks it holds
  const sites = useMemo(() => {
    const bySite = new Map<string, typeof rows>();
    for (const r of rows) {
      const key = `${r.latitude},${r.longitude}`;
      const list = bySite.get(key);
      if (list) list.push(r);
      else bySite.set(key, [r]);
    }
    return [...bySite.entries()].map(([key, nets]) => ({ key, nets }));
  }, [rows]);
  const [chosenSite, setChosenSite] = useState<string | null>(null);
  const points: MapPoint[] = sites
    .map(({ key, nets }) => {
      const first = nets[0];
      const mixCounts = new Map<string, number>();
      for (const r of nets) mixCounts.set(r.interactionType, (mixCounts.get(r.interactionType) ?? 0) + 1);
      const mix = [...mixCounts.entries()].sort((a, b) => b[1] - a[1]);
      const place = `${first.placeName ?? "unnamed site"}${first.countryCode ? `, ${first.countryCode}` : ""}`;
      return {
        id: key,
        latitude: first.latitude,
        longitude: first.longitude,
        colour: interactionTypeColour[mix[0][0]] ?? "#000",
        count: nets.length,
        mix: mix.map(([t, n]) => ({ colour: interactionTypeColour[t] ?? "#000", n })),
        title: `${nets.length} network${nets.length === 1 ? "" : "s"} at ${place}: ${mix.map(([t, n]) => `${n} ${interactionTypeLabel[t] ?? t}`).join(", ")}`,
        href: `#site-${key}`,
      };
    })
    // big sites first, so that small ones nearby stay on top and clickable
    .sort((a, b) => (b.count ?? 1) - (a.count ?? 1));
  const site = sites.find((x) => x.key === chosenSite) ?? null;
  const types = [...new Set(rows.map((r) => r.interactionType))].sort();
  const byCountry = new Map<string, number>();
  for (const r of rows) byCountry.set(r.countryCode ?? "—", (byCountry.get(r.countryCode ?? "—") ?? 0) + 1);
  const lat = { north: rows.filter((r) => r.latitude > 23.5).length, tropics: rows.filter((r) => Math.abs(r.latitude) <= 23.5).length, south: rows.filter((r) => r.latitude < -23.5).length };
  const current = params.get("interactionType") ?? "";
  const area = parseArea(params.get("bbox"));
  const [drawing, setDrawing] = useState(false);
  const applyArea = (a: MapArea | null) => {
    const p = new URLSearchParams(params);
    if (a) p.set("bbox", [a.west, a.south, a.east, a.north].join(","));
    else p.delete("bbox");
    setDrawing(false);
    setParams(p);
  };

  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-2xl font-bold text-moss-700">Coverage map</h1>
        <p className="mt-1 max-w-3xl text-stone-700">Where the catalogue's networks were sampled. Empty regions are gaps in the record. Coordinates of sensitive sites are generalised.</p>
      </header>
      <section aria-labelledby="filters-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
        <h2 id="filters-h" className="font-bold text-moss-700">
          Filters
        </h2>
        <div className="mt-2 flex flex-wrap items-end gap-4">
          <div>
            <label htmlFor="map-type" className="block text-sm font-semibold text-stone-800">
              Interaction type
            </label>
            <select
              id="map-type"
              className="mt-1 rounded border border-stone-400 px-2 py-1"
              value={current}
              onChange={(e) => {
                const p = new URLSearchParams(params);
                if (e.target.value) p.set("interactionType", e.target.value);
                else p.delete("interactionType");
                setParams(p);
              }}
            >
              <option value="">All types</option>
              {Object.entries(interactionTypeLabel).map(([k, l]) => (
                <option key={k} value={k}>
                  {l}
                </option>
              ))}
            </select>
          </div>
          <ul className="flex flex-wrap gap-2 text-sm" aria-label="Active filters">
            {[...filters].map(([k, v]) => (
              <li key={`${k}=${v}`} className="rounded-full bg-moss-50 px-3 py-0.5 ring-1 ring-moss-200">
                {FILTER_NAMES[k]}: {v}
              </li>
            ))}
            {[...filters].length === 0 && <li className="text-stone-700">No filters: the whole catalogue.</li>}
          </ul>
          <Link className="text-sm font-semibold text-moss-700 underline" to={`${paths.catalogue.href()}${query ? `?${query}` : ""}`}>
            {area ? "Show these networks in the catalogue" : "Refine these filters in the catalogue"}
          </Link>
        </div>
        <AreaPanel area={area} drawing={drawing} onDrawing={setDrawing} onApply={applyArea} />
      </section>
      {q.isError && (
        <p role="alert" className="rounded border border-red-300 bg-red-50 p-3 text-red-900">
          {q.error.message}
        </p>
      )}
      <ChartFigure
        id="coverage"
        title={
          q.data
            ? `${q.data.meta.placed} of ${q.data.meta.total} matching networks placed${q.data.meta.total > q.data.meta.placed ? ` (${q.data.meta.total - q.data.meta.placed} with coordinates not recorded)` : ""}`
            : "Loading networks…"
        }
        caption={
          q.data
            ? `North of the Tropic of Cancer: ${lat.north}; in the tropics: ${lat.tropics}; south of the Tropic of Capricorn: ${lat.south}. By country: ${[...byCountry.entries()]
                .sort((a, b) => b[1] - a[1])
                .map(([c, n]) => `${c} ${n}`)
                .join(", ") || "none"}. ${sites.length} site${sites.length === 1 ? "" : "s"}: a marker's area grows with the number of networks at the site (written on it), its ring shows the interaction types; select one to list its networks.`
            : ""
        }
        table={{
          caption: "Networks on the map",
          columns: ["network", "place", "country", "latitude", "longitude", "type"],
          rows: rows.map((r) => [r.ref, r.placeName ?? "", r.countryCode ?? "", r.latitude, r.longitude, interactionTypeLabel[r.interactionType] ?? r.interactionType]),
        }}
      >
        <WorldMap
          points={points}
          label={`World map with ${points.length} sampled networks`}
          onPointActivate={(p) => setChosenSite(p.id)}
          area={area}
          drawing={drawing}
          onAreaDrawn={applyArea}
        />
        <Legend title="Interaction type" items={types.map((t) => ({ label: interactionTypeLabel[t] ?? t, colour: interactionTypeColour[t] ?? "#000" }))} />
      </ChartFigure>
      {site && (
        <section aria-labelledby="site-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200" data-testid="site-panel">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="site-h" className="text-lg font-bold text-moss-700">
              {site.nets.length} network{site.nets.length === 1 ? "" : "s"} at {site.nets[0].placeName ?? "this site"}
              {site.nets[0].countryCode ? `, ${site.nets[0].countryCode}` : ""}
            </h2>
            <button type="button" className="text-sm font-semibold text-stone-700 underline" onClick={() => setChosenSite(null)}>
              Close
            </button>
          </div>
          <p className="text-sm text-stone-700">
            Public coordinates {site.nets[0].latitude}, {site.nets[0].longitude}
            {" — "}
            {[...new Set(site.nets.map((r) => r.interactionType))].map((t) => `${site.nets.filter((r) => r.interactionType === t).length} ${interactionTypeLabel[t] ?? t}`).join(", ")}.
          </p>
          <ul className="mt-2 max-h-80 space-y-1 overflow-y-auto text-sm">
            {site.nets.map((r) => {
              const [acc, v, pos] = r.ref.split("/");
              return (
                <li key={r.ref} className="flex flex-wrap items-baseline gap-2">
                  <span aria-hidden="true" className="inline-block h-2.5 w-2.5 rounded-full" style={{ background: interactionTypeColour[r.interactionType] ?? "#000" }} />
                  <Link className="font-semibold text-moss-700 underline" to={paths.networkView.href(acc, Number(v.slice(1)), Number(pos))}>
                    {r.name}
                  </Link>
                  <span className="text-stone-700">{r.title}</span>
                  <span className="font-mono text-xs text-stone-600">{r.ref}</span>
                </li>
              );
            })}
          </ul>
        </section>
      )}
    </div>
  );
}
