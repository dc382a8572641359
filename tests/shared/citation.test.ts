/**
 * Citation formatting, checked by reading the output back with independent, widely used parsers:
 * BibTeX with @retorquere/bibtex-parser (the parser of Better BibTeX for Zotero) and RIS with
 * citation-js (@citation-js/core + @citation-js/plugin-ris). The metadata below is invented (demo only).
 */
import { describe, expect, it } from "vitest";
import { parse as parseBibTeX } from "@retorquere/bibtex-parser";
import { Cite } from "@citation-js/core";
import "@citation-js/plugin-ris";
import { collectionToBibTeX, collectionToRIS, formatCollectionCitation, datasetBibTeX, formatCitationText, splitName, toBibTeX, toRIS, escapeBibTeX, type CitationInput } from "@shared/citation";

const input: CitationInput = {
  metadata: {
    title: "Flower visitors of the Verrin Hills: 50% of links & {modules}_2019",
    creators: [{ name: "Rowan Hale", orcid: "0000-0002-1825-0097" }, { name: "Okafor, Inès Adaeze" }, { name: "van der Strand, Pavel" }],
    keywords: ["pollination", "modularity"],
    licence: "CC-BY-4.0",
    description: "Invented demo data.\nTwo lines.",
  },
  accession: "TB-000042",
  version: 2,
  year: 2025,
  url: "https://tanglebank.test/datasets/TB-000042/v/2",
};

interface CslName {
  family?: string;
  given?: string;
}
interface CslItem {
  type: string;
  title: string;
  author: CslName[];
  issued: { "date-parts": number[][] };
  URL: string;
  publisher?: string;
  keyword?: string;
}

describe("splitName", () => {
  it("reads 'Family, Given' as written and otherwise takes the last word as family name", () => {
    expect(splitName("Okafor, Inès Adaeze")).toEqual({ family: "Okafor", given: "Inès Adaeze" });
    expect(splitName("  Rowan   Hale ")).toEqual({ family: "Hale", given: "Rowan" });
    expect(splitName("Plato")).toEqual({ family: "Plato", given: "" });
  });
});

describe("formatCitationText", () => {
  it("lists authors with initials, year, title, version, publisher, accession and URL", () => {
    expect(formatCitationText(input)).toBe(
      "Hale R, Okafor IA, van der Strand P (2025) Flower visitors of the Verrin Hills: 50% of links & {modules}_2019. Version 2. Tanglebank. TB-000042. https://tanglebank.test/datasets/TB-000042/v/2",
    );
  });
});

describe("toBibTeX", () => {
  it("escapes LaTeX specials", () => {
    expect(escapeBibTeX("a & b_c {d} 50% #1 $x")).toBe("a \\& b\\_c \\{d\\} 50\\% \\#1 \\$x");
  });

  it("produces an entry that a BibTeX parser reads back without errors and with the same fields", () => {
    const bib = toBibTeX(input);
    // sentenceCase: false reads titles as written (the default re-cases English titles the way Zotero wants)
    const parsed = parseBibTeX(bib, { sentenceCase: false });
    expect(parsed.errors).toEqual([]);
    expect(parsed.entries).toHaveLength(1);
    const e = parsed.entries[0];
    expect(e.type).toBe("dataset");
    expect(e.key).toBe("TB-000042-v2");
    expect(e.fields.version).toBe("2");
    expect(e.fields.publisher).toEqual(["Tanglebank"]);
    expect(e.fields.title).toBe("Flower visitors of the Verrin Hills: 50% of links & {modules}_2019");
    expect(e.fields.year).toBe("2025");
    expect(e.fields.url).toBe(input.url);
    const authors = e.fields.author as Array<{ lastName: string; firstName?: string; prefix?: string }>;
    // BibTeX reads "van der" as the von part of the family name
    expect(authors.map((a) => [a.prefix ? `${a.prefix} ${a.lastName}` : a.lastName, a.firstName])).toEqual([
      ["Hale", "Rowan"],
      ["Okafor", "Inès Adaeze"],
      ["van der Strand", "Pavel"],
    ]);
  });

  it("adds the source publication as an entry of its own, named by the dataset entry's related field (DOI given in any of its usual forms)", () => {
    for (const doi of ["10.1111/oik.05123", "https://doi.org/10.1111/oik.05123", "doi:10.1111/oik.05123"]) {
      const withSource = { ...input, metadata: { ...input.metadata, publication: { citation: "Hale R & Okafor I (2021) Modules of heath {pollination}. Oikos 130:1–12.", doi } } };
      const parsed = parseBibTeX(datasetBibTeX(withSource), { sentenceCase: false });
      expect(parsed.errors).toEqual([]);
      expect(parsed.entries.map((e) => [e.type, e.key])).toEqual([
        ["dataset", "TB-000042-v2"],
        ["misc", "TB-000042-v2-source"],
      ]);
      expect(parsed.entries[0].fields.related).toBe("TB-000042-v2-source");
      const src = parsed.entries[1].fields;
      expect(src.title).toBe("Hale R & Okafor I (2021) Modules of heath {pollination}. Oikos 130:1–12.");
      expect(src.doi).toBe("10.1111/oik.05123");
      expect(src.url).toBe("https://doi.org/10.1111/oik.05123");
      expect(src.year).toBe("2021");
    }
    // no citation entered: the dataset entry alone, without a related field
    const alone = parseBibTeX(datasetBibTeX(input), { sentenceCase: false });
    expect(alone.entries.map((e) => e.type)).toEqual(["dataset"]);
    expect(alone.entries[0].fields.related).toBeUndefined();
  });

  it("keeps a broken title from breaking the entry (unbalanced braces are escaped)", () => {
    const bib = toBibTeX({ ...input, metadata: { ...input.metadata, title: "Half {open" } });
    // sentenceCase: false reads titles as written (the default re-cases English titles the way Zotero wants)
    const parsed = parseBibTeX(bib, { sentenceCase: false });
    expect(parsed.errors).toEqual([]);
    expect(parsed.entries[0].fields.title).toBe("Half {open");
  });
});

describe("toRIS", () => {
  it("produces a record that citation-js reads as a dataset with authors, title, year and URL", () => {
    const ris = toRIS(input);
    expect(ris.startsWith("TY  - DATA\r\n")).toBe(true);
    expect(ris.endsWith("ER  - \r\n")).toBe(true);
    const items = new Cite(ris).data as CslItem[];
    expect(items).toHaveLength(1);
    const it0 = items[0];
    expect(it0.type).toBe("dataset");
    expect(it0.title).toBe(input.metadata.title);
    expect(it0.author.map((a) => [a.family, a.given])).toEqual([
      ["Hale", "Rowan"],
      ["Okafor", "Inès Adaeze"],
      ["van der Strand", "Pavel"],
    ]);
    expect(it0.issued["date-parts"][0][0]).toBe(2025);
    expect(it0.URL).toBe(input.url);
    expect(it0.publisher).toBe("Tanglebank");
  });

  it("puts a multi-line description on one line so the record stays valid", () => {
    const ris = toRIS(input);
    expect(ris).toContain("AB  - Invented demo data. Two lines.\r\n");
  });
});

describe("a registered DOI in every format", () => {
  const withDoi: CitationInput = { ...input, doi: "10.5072/tb-000042.v2" };

  it("text: the DOI's resolver URL is the identifier", () => {
    expect(formatCitationText(withDoi)).toMatch(/\. Tanglebank\. TB-000042\. https:\/\/doi\.org\/10\.5072\/tb-000042\.v2$/);
    expect(formatCitationText(input)).toMatch(/https:\/\/tanglebank\.test\/datasets\/TB-000042\/v\/2$/);
  });

  it("BibTeX: a doi field that the parser reads back", () => {
    const parsed = parseBibTeX(toBibTeX(withDoi), { sentenceCase: false });
    expect(parsed.errors).toEqual([]);
    expect(parsed.entries[0].fields.doi).toBe("10.5072/tb-000042.v2");
    expect(parseBibTeX(toBibTeX(input), { sentenceCase: false }).entries[0].fields.doi).toBeUndefined();
  });

  it("RIS: a DO tag that citation-js reads as the DOI", () => {
    const items = new Cite(toRIS(withDoi)).data as Array<CslItem & { DOI?: string }>;
    expect(items[0].DOI).toBe("10.5072/tb-000042.v2");
  });
});

describe("collection citations", () => {
  const c = { name: "Heath webs for the 2026 meta-analysis", description: "24 plant–pollinator webs.", owner: "Rowan Hale", code: "TBC-000012", revision: 3, networks: 24, year: 2026, url: "https://tanglebank.test/collections/TBC-000012?revision=3" };

  it("names the owner, year, name, code, revision, size and address", () => {
    expect(formatCollectionCitation(c)).toBe(
      "Hale R (2026) Heath webs for the 2026 meta-analysis. Tanglebank collection TBC-000012, revision 3 (24 networks). https://tanglebank.test/collections/TBC-000012?revision=3",
    );
  });

  it("BibTeX: a @dataset entry a BibTeX parser reads back; RIS: a dataset record citation-js reads back", () => {
    const parsed = parseBibTeX(collectionToBibTeX(c), { sentenceCase: false });
    expect(parsed.errors).toEqual([]);
    const e = parsed.entries[0];
    expect([e.type, e.key]).toEqual(["dataset", "TBC-000012-r3"]);
    expect(e.fields.title).toBe(c.name);
    expect(e.fields.url).toBe(c.url);
    expect((e.fields.author as Array<{ lastName: string }>)[0].lastName).toBe("Hale");
    const items = new Cite(collectionToRIS(c)).data as CslItem[];
    expect(items[0].type).toBe("dataset");
    expect(items[0].title).toBe(c.name);
    expect(items[0].URL).toBe(c.url);
    expect(items[0].author.map((a) => a.family)).toEqual(["Hale"]);
  });
});
