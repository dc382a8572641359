import { Link } from "react-router-dom";
import { paths } from "../../config/paths";

export function HomePage() {
  return (
    <div className="space-y-8">
      <section className="rounded-lg bg-white p-8 shadow-sm ring-1 ring-stone-200">
        <h1 className="text-3xl font-bold text-moss-700">Ecological interaction networks, deposited, curated and measured the same way</h1>
        <p className="mt-4 max-w-3xl text-lg text-stone-700">
          Tanglebank keeps plant–pollinator, seed-dispersal, host–parasitoid and food-web networks with structured metadata. Every
          published network gets its node and link counts, connectance, optimized modularity with its partition, and its significance
          against null models from one reproducible pipeline, so figures can be compared across studies.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link to={paths.catalogue.href()} className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600">Browse the catalogue</Link>
          <Link to={paths.deposit.href()} className="rounded border border-moss-700 px-4 py-2 font-semibold text-moss-700 hover:bg-moss-50">Deposit a network</Link>
        </div>
      </section>
      <section className="grid gap-4 md:grid-cols-3">
        {[
          ["For meta-analysts", "Filter by interaction type, region, size or modularity and download hundreds of networks as one bundle with a manifest and a metrics table."],
          ["For depositors", "Upload matrices or edge lists, see an instant preview, describe sampling with validated metadata and get a citable accession."],
          ["For teachers and authors", "Link stable dataset pages with citations, plots of modules and null distributions, and notes on how to read them."],
        ].map(([h, t]) => (
          <div key={h} className="rounded-lg bg-white p-5 ring-1 ring-stone-200">
            <h2 className="font-bold text-moss-700">{h}</h2>
            <p className="mt-2 text-stone-700">{t}</p>
          </div>
        ))}
      </section>
    </div>
  );
}
