/**
 * Form building blocks: a labelled field with its hint and error (linked by aria-describedby), buttons,
 * and an alert box. `fieldErrorsOf(err)` turns an API error's `details` into `{ field: message }`.
 */
import { useId, type ButtonHTMLAttributes, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from "react";
import { ApiClientError } from "../../lib/api-client";

export function fieldErrorsOf(err: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  if (err instanceof ApiClientError && Array.isArray(err.details)) {
    for (const d of err.details) {
      const key = (d.path ?? "").replace(/^\//, "");
      if (key && !out[key]) out[key] = d.message;
    }
  }
  return out;
}

interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, "id"> {
  label: string;
  name: string;
  hint?: ReactNode;
  error?: string;
}

export function TextField({ label, name, hint, error, className, ...input }: TextFieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errId = error ? `${id}-error` : undefined;
  return (
    <div className={className}>
      {/* `required` on the input is announced; the visible mark stays out of the label's name. */}
      <div className="flex items-baseline gap-1 text-sm">
        <label htmlFor={id} className="font-semibold text-stone-800">
          {label}
        </label>
        {input.required && <span aria-hidden="true" className="text-stone-600">(required)</span>}
      </div>
      {hint && (
        <p id={hintId} className="mt-0.5 text-sm text-stone-600">
          {hint}
        </p>
      )}
      <input
        id={id}
        name={name}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hintId, errId].filter(Boolean).join(" ") || undefined}
        className={`mt-1 block w-full rounded border bg-white px-3 py-2 text-stone-900 shadow-sm focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200 ${error ? "border-red-700" : "border-stone-400"}`}
        {...input}
      />
      {error && (
        <p id={errId} className="mt-1 text-sm font-semibold text-red-800">
          {error}
        </p>
      )}
    </div>
  );
}

interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, "id"> {
  label: string;
  name: string;
  options: Array<{ value: string; label: string }>;
  hideLabel?: boolean;
}

export function SelectField({ label, name, options, hideLabel, className, ...select }: SelectFieldProps) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className={hideLabel ? "sr-only" : "block text-sm font-semibold text-stone-800"}>
        {label}
      </label>
      <select
        id={id}
        name={name}
        className={`${hideLabel ? "" : "mt-1 "}block w-full rounded border border-stone-400 bg-white px-3 py-2 text-stone-900 focus:border-moss-600 focus:outline-none focus:ring-2 focus:ring-moss-200`}
        {...select}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & { variant?: "primary" | "secondary" | "danger"; busy?: boolean };

export function Button({ variant = "primary", busy, className = "", children, disabled, ...rest }: ButtonProps) {
  const look = {
    primary: "bg-moss-700 text-white hover:bg-moss-600",
    secondary: "border border-moss-700 bg-white text-moss-700 hover:bg-moss-50",
    danger: "border border-red-800 bg-white text-red-800 hover:bg-red-50",
  }[variant];
  return (
    <button
      type="submit"
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center rounded px-4 py-2 font-semibold disabled:cursor-not-allowed disabled:opacity-60 ${look} ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}

export function Alert({ tone, title, children }: { tone: "error" | "success" | "info"; title?: string; children?: ReactNode }) {
  const look = {
    error: "border-red-800 bg-red-50 text-red-900",
    success: "border-moss-600 bg-moss-50 text-moss-900",
    info: "border-lichen-600 bg-lichen-300/30 text-stone-900",
  }[tone];
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded border-l-4 p-4 ${look}`}>
      {title && <p className="font-bold">{title}</p>}
      {children && <div className={title ? "mt-1" : ""}>{children}</div>}
    </div>
  );
}

/** A white card with a heading, used for the forms of the account pages. */
export function Card({ title, children, className = "", headingLevel = 2 }: { title?: string; children: ReactNode; className?: string; headingLevel?: 1 | 2 }) {
  const H = headingLevel === 1 ? "h1" : "h2";
  return (
    <section className={`rounded-lg bg-white p-6 shadow-sm ring-1 ring-stone-200 ${className}`}>
      {title && <H className={`${headingLevel === 1 ? "text-2xl" : "text-lg"} font-bold text-moss-700`}>{title}</H>}
      <div className={title ? "mt-4" : ""}>{children}</div>
    </section>
  );
}
