import type { ReactNode } from "react";

/** The narrow centred card the sign-in, sign-up and link pages share. */
export function AuthPanel({ title, intro, children, footer }: { title: string; intro?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="mx-auto max-w-md py-6">
      <section className="rounded-lg bg-white p-8 shadow-sm ring-1 ring-stone-200">
        <h1 className="text-2xl font-bold text-moss-700">{title}</h1>
        {intro && <div className="mt-2 text-stone-700">{intro}</div>}
        <div className="mt-6">{children}</div>
      </section>
      {footer && <div className="mt-4 space-y-1 text-center text-sm text-stone-700">{footer}</div>}
    </div>
  );
}
