/** The frame every section of the dataset page shares: a white card with its heading. */
import type { ReactNode } from "react";

export const sectionCard = "rounded-lg bg-white p-4 ring-1 ring-stone-200";
export const sectionHeading = "text-lg font-bold text-moss-700";

export function SectionCard({ id, heading, children }: { id: string; heading: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className={sectionCard}>
      <h2 id={id} className={sectionHeading}>
        {heading}
      </h2>
      {children}
    </section>
  );
}
