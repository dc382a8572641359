/** What the study and network blocks of the review page share: a metadata line, and saving or cancelling a correction (who may correct what: utils/corrections.ts). */
import type { ReactNode } from "react";
import { Alert, Button } from "../../../components/ui/form";

export function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <>
      <dt className="font-semibold text-stone-800">{label}</dt>
      <dd className="text-stone-900">{children ?? "—"}</dd>
    </>
  );
}

/** Opens a correction form. */
export function CorrectButton({ onClick, children }: { onClick: () => void; children: ReactNode }) {
  return (
    <button type="button" onClick={onClick} className="mt-3 rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50">
      {children}
    </button>
  );
}

/** The end of a correction form: why saving failed, save and cancel. */
export function CorrectionActions({ error, busy, onCancel }: { error: Error | null; busy: boolean; onCancel: () => void }) {
  return (
    <>
      {error && <div className="mt-3"><Alert tone="error" title={error.message} /></div>}
      <div className="mt-3 flex gap-2">
        <Button busy={busy}>Save correction</Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </>
  );
}
