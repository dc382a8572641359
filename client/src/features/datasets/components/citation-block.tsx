/** How to cite this version: text with a copy button, BibTeX and RIS downloads (shared/citation). */
import { useMemo } from "react";
import { datasetBibTeX, formatCitationText, toRIS, type CitationInput } from "@shared/citation";
import { CitationPanel } from "../../../components/citation/citation-panel";

export function CitationBlock({ input }: { input: CitationInput }) {
  const text = useMemo(() => formatCitationText(input), [input]);
  const bib = useMemo(() => datasetBibTeX(input), [input]);
  const ris = useMemo(() => toRIS(input), [input]);
  return <CitationPanel heading="Cite this dataset" text={text} bibtex={bib} ris={ris} fileBase={`${input.accession}-v${input.version}`} />;
}
