/**
 * The network-level metadata form (fields of schemas/network.schema.json): interaction, weights, row and column node
 * names (bipartite) or direction (directed one-mode), locality with coordinate generalisation for
 * sensitive sites, habitat, dates, sampling.
 */
import type { Locality, NetworkMetadata } from "@shared/types/dataset";
import { Area, Choice, NumberText, Text } from "./fields";
import { NOT_RECORDED_LABELS, type NotRecordedField } from "@shared/validation/not-recorded";
import type { FieldErrors } from "./validate";

export type NetworkDraft = Partial<Omit<NetworkMetadata, "locality" | "samplingEffort">> & {
  locality?: Partial<Omit<Locality, "decimalLatitude" | "decimalLongitude" | "elevation">> & { decimalLatitude?: number | string; decimalLongitude?: number | string; elevation?: number | string };
  samplingEffort?: { value?: number | string; unit?: string };
};

const INTERACTIONS = ["pollination", "seed-dispersal", "host-parasitoid", "predator-prey", "herbivory", "other"].map((v) => ({ value: v, label: v.replace("-", " ") }));
const WEIGHTS = [
  { value: "binary", label: "binary (present/absent)" },
  { value: "visit-count", label: "visit counts" },
  { value: "interaction-frequency", label: "interaction frequency" },
  { value: "biomass", label: "biomass" },
  { value: "other", label: "other" },
];
const GENERALISATION = [
  { value: "exact", label: "exact (public)" },
  { value: "0.01", label: "0.01° (about 1 km)" },
  { value: "0.1", label: "0.1° (about 10 km)" },
  { value: "1", label: "1° (about 100 km)" },
];

/**
 * "Not recorded": a box that, ticked, empties and locks the field's inputs and asks for the reason
 * (stored under `notRecorded`), so an unknown value is said instead of invented.
 */
function NotRecordedBox({ field, value, onChange, error, disabled }: { field: NotRecordedField; value: NetworkDraft; onChange: (v: NetworkDraft) => void; error?: string; disabled?: boolean }) {
  const nr = value.notRecorded ?? {};
  const on = nr[field] !== undefined;
  const label = NOT_RECORDED_LABELS[field];
  const toggle = (checked: boolean) => {
    const next: NetworkDraft = { ...value, notRecorded: { ...nr } };
    if (checked) {
      next.notRecorded![field] = "";
      const loc = { ...(value.locality ?? {}) };
      if (field === "coordinates") {
        delete loc.decimalLatitude;
        delete loc.decimalLongitude;
        delete loc.coordinatePrecision;
        delete loc.generalisation;
      }
      if (field === "elevation") delete loc.elevation;
      next.locality = loc;
      if (field === "dates") {
        delete next.startDate;
        delete next.endDate;
      }
      if (field === "habitat") delete next.habitat;
      if (field === "samplingEffort") delete next.samplingEffort;
    } else delete next.notRecorded![field];
    onChange(next);
  };
  return (
    <div className="md:col-span-3">
      <label className="flex items-center gap-1.5 text-sm text-stone-800">
        <input type="checkbox" checked={on} disabled={disabled} onChange={(e) => toggle(e.target.checked)} />
        {label} not recorded
      </label>
      {on && (
        <Text
          label={`Why ${label.toLowerCase()} ${field === "dates" || field === "coordinates" ? "are" : "is"} not recorded`}
          required
          value={nr[field]}
          onChange={(reason) => onChange({ ...value, notRecorded: { ...nr, [field]: reason } })}
          error={error}
          hint="e.g. not given in the source publication"
          className="mt-1"
          disabled={disabled}
        />
      )}
    </div>
  );
}

export function NetworkForm({ value, onChange, errors, kind, directed, disabled }: { value: NetworkDraft; onChange: (v: NetworkDraft) => void; errors: FieldErrors; kind: "bipartite" | "unipartite"; directed: boolean; disabled?: boolean }) {
  const set = (patch: Partial<NetworkDraft>) => onChange({ ...value, ...patch });
  const loc = value.locality ?? {};
  const setLoc = (patch: Partial<NonNullable<NetworkDraft["locality"]>>) => set({ locality: { ...loc, ...patch } });
  const effort = value.samplingEffort ?? {};
  const nr = value.notRecorded ?? {};
  const box = (field: NotRecordedField) => <NotRecordedBox field={field} value={value} onChange={onChange} error={errors[`/notRecorded/${field}`]} disabled={disabled} />;
  return (
    <div className="grid gap-4">
      <div className="grid gap-4 md:grid-cols-3">
        <Text label="Network name" required value={value.name} onChange={(name) => set({ name })} error={errors["/name"]} disabled={disabled} />
        <Choice label="Interaction type" required value={value.interactionType} onChange={(v) => set({ interactionType: (v || undefined) as NetworkDraft["interactionType"] })} options={INTERACTIONS} error={errors["/interactionType"]} disabled={disabled} />
        <Choice label="What the weights mean" required value={value.weightMeaning} onChange={(v) => set({ weightMeaning: (v || undefined) as NetworkDraft["weightMeaning"] })} options={WEIGHTS} error={errors["/weightMeaning"]} disabled={disabled} />
      </div>
      {kind === "bipartite" ? (
        <div className="grid gap-4 md:grid-cols-2">
          <Text label="Row nodes are" required value={value.rowLevel} onChange={(rowLevel) => set({ rowLevel })} error={errors["/rowLevel"]} hint="e.g. plants" disabled={disabled} />
          <Text label="Column nodes are" required value={value.colLevel} onChange={(colLevel) => set({ colLevel })} error={errors["/colLevel"]} hint="e.g. pollinators" disabled={disabled} />
        </div>
      ) : directed ? (
        <Text label="What a link from row to column means" required value={value.directionMeaning} onChange={(directionMeaning) => set({ directionMeaning })} error={errors["/directionMeaning"]} hint="Conventions differ between studies, e.g. “row eats column”." disabled={disabled} />
      ) : null}
      <fieldset className="rounded border border-stone-300 p-4">
        <legend className="px-1 text-sm font-semibold text-stone-800">Locality</legend>
        <div className="grid gap-4 md:grid-cols-3">
          <Text label="Place name" required value={loc.placeName} onChange={(placeName) => setLoc({ placeName })} error={errors["/locality/placeName"]} className="md:col-span-2" disabled={disabled} />
          <Text label="Country code" required value={loc.countryCode} onChange={(countryCode) => setLoc({ countryCode: countryCode.toUpperCase() })} error={errors["/locality/countryCode"]} hint="ISO 3166-1, two letters" disabled={disabled} />
          <NumberText label="Latitude" required={nr.coordinates === undefined} value={loc.decimalLatitude ?? undefined} onChange={(v) => setLoc({ decimalLatitude: v })} error={errors["/locality/decimalLatitude"]} hint="decimal degrees, WGS84" disabled={disabled || nr.coordinates !== undefined} />
          <NumberText label="Longitude" required={nr.coordinates === undefined} value={loc.decimalLongitude ?? undefined} onChange={(v) => setLoc({ decimalLongitude: v })} error={errors["/locality/decimalLongitude"]} hint="decimal degrees, WGS84" disabled={disabled || nr.coordinates !== undefined} />
          <NumberText label="Elevation (m)" value={loc.elevation} onChange={(v) => setLoc({ elevation: v })} error={errors["/locality/elevation"]} disabled={disabled || nr.elevation !== undefined} />
          {box("coordinates")}
          {box("elevation")}
          <Choice
            label="Public coordinates"
            required={nr.coordinates === undefined}
            value={loc.generalisation}
            onChange={(v) => setLoc({ generalisation: (v || undefined) as Locality["generalisation"] })}
            options={GENERALISATION}
            error={errors["/locality/generalisation"]}
            hint="Sensitive site (e.g. threatened taxa)? Public pages, the API and bundles then show coordinates rounded to this grid and the elevation to 50, 100 or 500 m; curators see the exact ones."
            className="md:col-span-3"
            disabled={disabled || nr.coordinates !== undefined}
          />
        </div>
      </fieldset>
      <div className="grid gap-4 md:grid-cols-3">
        <Text label="Habitat" required={nr.habitat === undefined} value={value.habitat} onChange={(habitat) => set({ habitat })} error={errors["/habitat"]} disabled={disabled || nr.habitat !== undefined} />
        <Text label="Start date" required={nr.dates === undefined} type="date" value={value.startDate} onChange={(startDate) => set({ startDate })} error={errors["/startDate"]} disabled={disabled || nr.dates !== undefined} />
        <Text label="End date" required={nr.dates === undefined} type="date" value={value.endDate} onChange={(endDate) => set({ endDate })} error={errors["/endDate"]} disabled={disabled || nr.dates !== undefined} />
        {box("habitat")}
        {box("dates")}
      </div>
      <Area label="Sampling protocol" required rows={3} value={value.samplingProtocol} onChange={(samplingProtocol) => set({ samplingProtocol })} error={errors["/samplingProtocol"]} disabled={disabled} />
      <div className="grid gap-4 md:grid-cols-3">
        <NumberText label="Sampling effort" value={effort.value} onChange={(v) => set({ samplingEffort: { ...effort, value: v } })} error={errors["/samplingEffort/value"] ?? errors["/samplingEffort"]} disabled={disabled || nr.samplingEffort !== undefined} />
        <Text label="Effort unit" value={effort.unit} onChange={(unit) => set({ samplingEffort: { ...effort, unit } })} error={errors["/samplingEffort/unit"]} hint="e.g. observation hours" disabled={disabled || nr.samplingEffort !== undefined} />
        <Text label="Taxonomic resolution" value={value.taxonomicResolution} onChange={(taxonomicResolution) => set({ taxonomicResolution })} error={errors["/taxonomicResolution"]} disabled={disabled} />
        {box("samplingEffort")}
      </div>
    </div>
  );
}
