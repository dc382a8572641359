import type { Role } from "@shared/types/auth";

/** Shown to a signed-in person whose role is too low for a page (the API answers 403 as well). */
export function NotAllowed({ min, what }: { min: Role; what: string }) {
  return (
    <section className="mx-auto max-w-xl py-12" role="alert">
      <h1 className="text-2xl font-bold text-red-800">Not allowed</h1>
      <p className="mt-3 text-stone-700">
        {what} needs the {min} role. If you need access, ask an admin of this Tanglebank.
      </p>
    </section>
  );
}
