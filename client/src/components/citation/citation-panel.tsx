/** How to cite something: the text with a copy button, BibTeX and RIS downloads, the BibTeX shown on demand. */
import { useState, type ReactNode } from "react";
import { downloadText } from "../../lib/download";

const btn = "rounded border border-moss-700 px-3 py-1.5 text-sm font-semibold text-moss-700 hover:bg-moss-50";

export interface CitationPanelProps {
  heading: string;
  text: string;
  bibtex: string;
  ris: string;
  /** File name of the downloads, without extension (e.g. "TB-000042-v2"). */
  fileBase: string;
  children?: ReactNode;
}

export function CitationPanel({ heading, text, bibtex, ris, fileBase, children }: CitationPanelProps) {
  const [copied, setCopied] = useState<"idle" | "done" | "failed">("idle");
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
        {heading}
      </h2>
      <p className="mt-2 rounded bg-stone-50 p-3 break-words text-stone-900" data-testid="citation-text">
        {text}
      </p>
      {children}
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <button type="button" className={btn} onClick={copy}>
          Copy citation
        </button>
        <button type="button" className={btn} onClick={() => downloadText(`${fileBase}.bib`, "application/x-bibtex", bibtex)}>
          Download BibTeX
        </button>
        <button type="button" className={btn} onClick={() => downloadText(`${fileBase}.ris`, "application/x-research-info-systems", ris)}>
          Download RIS
        </button>
        <span role="status" className="text-sm text-stone-700">
          {copied === "done" ? "Copied to the clipboard." : copied === "failed" ? "Copying was blocked by the browser: select the text above instead." : ""}
        </span>
      </div>
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer font-semibold text-moss-700">Show BibTeX</summary>
        <pre className="mt-2 overflow-auto rounded bg-stone-50 p-2 text-xs">{bibtex}</pre>
      </details>
    </section>
  );
}
