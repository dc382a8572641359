/** A legend as an HTML list (readable by screen readers, wraps on small screens). */
export interface LegendItem {
  label: string;
  colour: string;
  shape?: "circle" | "square" | "line";
}

export function Legend({ items, title }: { items: LegendItem[]; title?: string }) {
  return (
    <div className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-stone-800">
      {title && <span className="font-semibold">{title}:</span>}
      <ul className="flex flex-wrap gap-x-4 gap-y-1" aria-label={title ?? "Legend"}>
        {items.map((i) => (
          <li key={i.label} className="flex items-center gap-1.5">
            <svg width="14" height="14" aria-hidden="true">
              {i.shape === "line" ? (
                <line x1="0" x2="14" y1="7" y2="7" stroke={i.colour} strokeWidth="3" />
              ) : i.shape === "square" ? (
                <rect x="1" y="1" width="12" height="12" fill={i.colour} />
              ) : (
                <circle cx="7" cy="7" r="5.5" fill={i.colour} stroke="#fff" />
              )}
            </svg>
            {i.label}
          </li>
        ))}
      </ul>
    </div>
  );
}
