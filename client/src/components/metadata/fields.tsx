/** Small labelled inputs for the metadata forms, with the field's error linked by aria-describedby. */
import { useId, type ReactNode } from "react";

const INPUT = "mt-1 block w-full rounded border bg-white px-3 py-2 text-stone-900 shadow-sm focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200";

function Frame({ id, label, required, hint, error, children, className }: { id: string; label: string; required?: boolean; hint?: ReactNode; error?: string; children: ReactNode; className?: string }) {
  return (
    <div className={className}>
      <div className="flex items-baseline gap-1 text-sm">
        <label htmlFor={id} className="font-semibold text-stone-800">
          {label}
        </label>
        {required && <span aria-hidden="true" className="text-stone-600">(required)</span>}
      </div>
      {hint && (
        <p id={`${id}-hint`} className="mt-0.5 text-sm text-stone-600">
          {hint}
        </p>
      )}
      {children}
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-semibold text-red-800" data-field-error>
          {error}
        </p>
      )}
    </div>
  );
}

function describedBy(id: string, hint?: ReactNode, error?: string): string | undefined {
  return [hint ? `${id}-hint` : "", error ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined;
}

export function Text(p: { label: string; value: string | undefined; onChange: (v: string) => void; error?: string; hint?: ReactNode; required?: boolean; type?: string; className?: string; disabled?: boolean; inputMode?: "decimal" | "text" }) {
  const id = useId();
  return (
    <Frame id={id} label={p.label} required={p.required} hint={p.hint} error={p.error} className={p.className}>
      <input
        id={id}
        type={p.type ?? "text"}
        value={p.value ?? ""}
        disabled={p.disabled}
        inputMode={p.inputMode}
        onChange={(e) => p.onChange(e.target.value)}
        aria-invalid={p.error ? true : undefined}
        aria-required={p.required || undefined}
        aria-describedby={describedBy(id, p.hint, p.error)}
        className={`${INPUT} ${p.error ? "border-red-700" : "border-stone-400"}`}
      />
    </Frame>
  );
}

export function Area(p: { label: string; value: string | undefined; onChange: (v: string) => void; error?: string; hint?: ReactNode; required?: boolean; rows?: number; className?: string; disabled?: boolean }) {
  const id = useId();
  return (
    <Frame id={id} label={p.label} required={p.required} hint={p.hint} error={p.error} className={p.className}>
      <textarea
        id={id}
        rows={p.rows ?? 4}
        value={p.value ?? ""}
        disabled={p.disabled}
        onChange={(e) => p.onChange(e.target.value)}
        aria-invalid={p.error ? true : undefined}
        aria-required={p.required || undefined}
        aria-describedby={describedBy(id, p.hint, p.error)}
        className={`${INPUT} ${p.error ? "border-red-700" : "border-stone-400"}`}
      />
    </Frame>
  );
}

export function Choice(p: { label: string; value: string | undefined; onChange: (v: string) => void; options: Array<{ value: string; label: string }>; error?: string; hint?: ReactNode; required?: boolean; className?: string; disabled?: boolean }) {
  const id = useId();
  return (
    <Frame id={id} label={p.label} required={p.required} hint={p.hint} error={p.error} className={p.className}>
      <select
        id={id}
        value={p.value ?? ""}
        disabled={p.disabled}
        onChange={(e) => p.onChange(e.target.value)}
        aria-invalid={p.error ? true : undefined}
        aria-required={p.required || undefined}
        aria-describedby={describedBy(id, p.hint, p.error)}
        className={`${INPUT} ${p.error ? "border-red-700" : "border-stone-400"}`}
      >
        <option value="">— choose —</option>
        {p.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Frame>
  );
}

/** Number input kept as text while typing; emits a number, or undefined when blank, or the raw text when not a number (so the schema reports it). */
export function NumberText(p: { label: string; value: number | string | undefined; onChange: (v: number | string | undefined) => void; error?: string; hint?: ReactNode; required?: boolean; className?: string; disabled?: boolean }) {
  return (
    <Text
      {...p}
      inputMode="decimal"
      value={p.value === undefined ? "" : String(p.value)}
      onChange={(s) => {
        const t = s.trim();
        if (t === "") return p.onChange(undefined);
        const n = Number(t);
        p.onChange(Number.isFinite(n) && /^-?\d*\.?\d*(e-?\d+)?$/i.test(t) && !t.endsWith(".") ? n : s);
      }}
    />
  );
}
