/** How to cite this version: text with a copy button, BibTeX and RIS downloads (shared/citation). */
import { useMemo, useState } from "react";
import { datasetBibTeX, formatCitationText, toRIS, type CitationInput } from "../../../../../shared/citation";

function download(name: string, type: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

const btn = "rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50";

export function CitationBlock({ input }: { input: CitationInput }) {
  const text = useMemo(() => formatCitationText(input), [input]);
  const bib = useMemo(() => datasetBibTeX(input), [input]);
  const [copied, setCopied] = useState<"idle" | "done" | "failed">("idle");
  const base = `${input.accession}-v${input.version}`;
  async function copy() {
    try {
      await navigator.clipboard.writeText(text);
      setCopied("done");
    } catch {
      setCopied("failed");
    }
  }
  return (
    <section aria-labelledby="cite-h" className="rounded-lg bg-white p-4 ring-1 ring-stone-200">
      <h2 id="cite-h" className="text-lg font-bold text-moss-700">
        Cite this dataset
      </h2>
      <p className="mt-2 rounded bg-stone-50 p-3 text-stone-900" data-testid="citation-text">
        {text}
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <button type="button" className={btn} onClick={copy}>
          Copy citation
        </button>
        <button type="button" className={btn} onClick={() => download(`${base}.bib`, "application/x-bibtex", bib)}>
          Download BibTeX
        </button>
        <button type="button" className={btn} onClick={() => download(`${base}.ris`, "application/x-research-info-systems", toRIS(input))}>
          Download RIS
        </button>
        <span role="status" className="text-sm text-stone-700">
          {copied === "done" ? "Copied to the clipboard." : copied === "failed" ? "Copying was blocked by the browser: select the text above instead." : ""}
        </span>
      </div>
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer font-semibold text-moss-700">Show BibTeX</summary>
        <pre className="mt-2 overflow-auto rounded bg-stone-50 p-2 text-xs">{bib}</pre>
      </details>
    </section>
  );
}
