/** A plain placeholder for a feature that is not built yet. It says so; it pretends nothing. */
export function ComingSoon({ title, what }: { title: string; what: string }) {
  return (
    <section className="mx-auto max-w-2xl py-8">
      <h1 className="text-2xl font-bold text-moss-700">{title}</h1>
      <p className="mt-3 rounded border border-lichen-400 bg-lichen-300/30 p-4 text-stone-800">
        This part of Tanglebank is still being built. {what}
      </p>
    </section>
  );
}
