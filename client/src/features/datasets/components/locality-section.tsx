/** The dataset page's "Where" section: each site with its (possibly generalised) coordinates and a locator map. */
import type { DatasetDetail, Locality, NetworkSummary } from "@shared/types/dataset";
import { WorldMap } from "../../../components/charts/world-map";
import { ChartFigure } from "../../../components/charts/chart-figure";
import { ValueOrNotRecorded } from "../../../components/metadata/not-recorded";
import { SectionCard } from "./section-card";

const GENERALISATION: Record<string, string> = {
  exact: "as recorded",
  "0.01": "generalised to 0.01° (about 1 km) to protect the site",
  "0.1": "generalised to 0.1° (about 11 km) to protect the site",
  "1": "generalised to 1° (about 110 km) to protect the site",
};

function coord(v: number | null | undefined, pos: string, neg: string) {
  if (v === null || v === undefined) return "—";
  return `${Math.abs(v)}° ${v >= 0 ? pos : neg}`;
}

interface Site {
  loc: Locality;
  /** A network of the site, for what its metadata marks not recorded. */
  meta: NetworkSummary["metadata"];
  networks: NetworkSummary[];
}

export function sitesOf(d: DatasetDetail): Site[] {
  const m = new Map<string, Site>();
  for (const n of d.networks) {
    const loc = n.metadata.locality;
    if (!loc) continue;
    const nr = n.metadata.notRecorded ?? {};
    const key = `${loc.placeName}|${loc.decimalLatitude}|${loc.decimalLongitude}|${n.metadata.habitat}|${nr.coordinates}|${nr.habitat}|${nr.elevation}`;
    const s = m.get(key);
    if (s) s.networks.push(n);
    else m.set(key, { loc, meta: n.metadata, networks: [n] });
  }
  return [...m.values()];
}

export function LocalitySection({ d }: { d: DatasetDetail }) {
  const sites = sitesOf(d);
  if (!sites.length) return null;
  const points = sites
    .filter((s) => typeof s.loc.decimalLatitude === "number" && typeof s.loc.decimalLongitude === "number")
    .map((s, i) => ({
      id: String(i),
      latitude: s.loc.decimalLatitude as number,
      longitude: s.loc.decimalLongitude as number,
      colour: "#b88a1c",
      title: `${s.loc.placeName}: ${coord(s.loc.decimalLatitude as number, "N", "S")}, ${coord(s.loc.decimalLongitude as number, "E", "W")}`,
    }));
  return (
    <SectionCard id="loc-h" heading="Where">
      <div className="mt-2 grid gap-4 lg:grid-cols-[1fr_36rem]">
        <ul className="space-y-3 text-sm">
          {sites.map((s, i) => (
            <li key={i}>
              <p className="font-semibold text-stone-900">
                {s.loc.placeName}
                {s.loc.countryCode && `, ${s.loc.countryCode}`}
              </p>
              <p className="text-stone-800">
                {typeof s.loc.decimalLatitude === "number" && typeof s.loc.decimalLongitude === "number" ? (
                  <>
                    {coord(s.loc.decimalLatitude, "N", "S")}, {coord(s.loc.decimalLongitude, "E", "W")} (WGS84, {GENERALISATION[s.loc.generalisation ?? "0.1"] ?? s.loc.generalisation})
                  </>
                ) : (
                  <>
                    Coordinates: <ValueOrNotRecorded meta={s.meta} field="coordinates" value={null} />
                  </>
                )}
                {s.loc.elevation !== undefined && s.loc.elevation !== null && ` · elevation ${s.loc.elevation} m`}
                {s.meta.notRecorded?.elevation && (
                  <>
                    {" "}
                    · elevation <ValueOrNotRecorded meta={s.meta} field="elevation" value={null} />
                  </>
                )}
              </p>
              <p className="text-stone-700">
                Habitat: <ValueOrNotRecorded meta={s.meta} field="habitat" value={s.meta.habitat} /> · networks {s.networks.map((n) => n.position).join(", ")}
              </p>
            </li>
          ))}
        </ul>
        <ChartFigure
          title="Locator map"
          caption={`${points.length} site${points.length === 1 ? "" : "s"}: the region (Mercator) and the world (Equal Earth), drawn from Natural Earth outlines shipped with Tanglebank.`}
        >
          <div className="grid grid-cols-2 gap-2">
            <WorldMap points={points} width={320} radius={6} region={30} label={`Regional map marking ${points.map((p) => p.title).join("; ")}`} />
            <WorldMap points={points} width={320} radius={5} label={`World map marking ${points.map((p) => p.title).join("; ")}`} />
          </div>
        </ChartFigure>
      </div>
    </SectionCard>
  );
}
