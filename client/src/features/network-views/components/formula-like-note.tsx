/**
 * Said in a network's downloads when some of its labels begin like a spreadsheet formula (=, +, -, @):
 * which labels, why the exact files keep them, and the spreadsheet-safe copies (those labels start with an
 * apostrophe there).
 */
const SHOWN = 6;

export function FormulaLikeNote({ labels, csvHref }: { labels: string[]; /** The network's CSV address, without a query. */ csvHref: string }) {
  if (!labels.length) return null;
  const n = labels.length;
  const link = "font-semibold text-moss-700 underline";
  return (
    <div role="note" className="mt-3 rounded border border-lichen-600 bg-lichen-300/40 p-3 text-sm text-stone-900" data-testid="formula-like-note">
      <p>
        <strong>
          {n} label{n === 1 ? " begins" : "s begin"} like a spreadsheet formula
        </strong>{" "}
        <span className="whitespace-nowrap">
          (with <Sym>=</Sym>, <Sym>+</Sym>, <Sym>-</Sym> or <Sym>@</Sym>)
        </span>
        :{" "}
        {labels.slice(0, SHOWN).map((l, i) => (
          <span key={i}>
            {i > 0 && ", "}
            <code className="rounded bg-white/70 px-1 font-mono text-xs break-words">{l}</code>
          </span>
        ))}
        {n > SHOWN && ` and ${n - SHOWN} more`}.
      </p>
      <p className="mt-1">
        The files above keep every label exactly, as scripts need them, but a spreadsheet program may run such a label as a formula when it opens the
        file. To open the network in a spreadsheet, take a spreadsheet-safe copy, where those labels start with an apostrophe:{" "}
        <a className={link} href={`${csvHref}?spreadsheetSafe=true`} download>
          matrix
        </a>{" "}
        or{" "}
        <a className={link} href={`${csvHref}?layout=edgelist&spreadsheetSafe=true`} download>
          edge list
        </a>
        .
      </p>
    </div>
  );
}

function Sym({ children }: { children: string }) {
  return <code className="rounded bg-white/70 px-0.5 font-mono">{children}</code>;
}
