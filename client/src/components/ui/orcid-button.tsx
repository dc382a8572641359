/** "Continue with ORCID" / "Link your ORCID iD": goes to ORCID's sign-in (or the local stand-in). */
import { useState } from "react";
import { goToOrcid } from "../../lib/orcid";

export function OrcidButton({ intent, next, label }: { intent: "sign-in" | "link"; next?: string; label: string }) {
  const [state, setState] = useState<{ busy: boolean; error: string | null }>({ busy: false, error: null });
  return (
    <div>
      <button
        type="button"
        className="inline-flex w-full items-center justify-center gap-2 rounded border border-stone-400 bg-white px-4 py-2 font-semibold text-stone-900 hover:bg-stone-50 disabled:opacity-60"
        disabled={state.busy}
        onClick={() => {
          setState({ busy: true, error: null });
          goToOrcid(intent, next).catch((err: unknown) => setState({ busy: false, error: err instanceof Error ? err.message : "ORCID could not be reached." }));
        }}
      >
        <span aria-hidden="true" className="inline-flex h-6 w-6 items-center justify-center rounded-full bg-[#3f6212] text-xs font-bold text-white">
          iD
        </span>
        {state.busy ? "Going to ORCID…" : label}
      </button>
      {state.error && (
        <p role="alert" className="mt-2 text-sm text-red-800">
          {state.error}
        </p>
      )}
    </div>
  );
}
