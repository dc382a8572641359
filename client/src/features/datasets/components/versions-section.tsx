/** The dataset page's list of versions, newest first, linking the ones the public can open. */
import { Link } from "react-router-dom";
import type { DatasetDetail } from "@shared/types/dataset";
import { paths } from "../../../config/paths";
import { SectionCard } from "./section-card";

export function VersionsSection({ d }: { d: DatasetDetail }) {
  return (
    <SectionCard id="versions-h" heading="Versions">
      <ol className="mt-2 space-y-1 text-sm">
        {[...d.versions]
          .sort((a, b) => b.number - a.number)
          .map((v) => (
            <li key={v.number}>
              {v.number === d.version.number ? (
                <span className="font-semibold">version {v.number} (shown)</span>
              ) : v.state === "published" || v.state === "withdrawn" ? (
                <Link className="text-moss-700 underline" to={paths.datasetVersion.href(d.accession!, v.number)}>
                  version {v.number}
                </Link>
              ) : (
                <span>version {v.number}</span>
              )}{" "}
              — {v.publishedAt ? `published ${v.publishedAt.slice(0, 10)}` : v.state.replace("_", " ")}
              {v.withdrawnAt && `, withdrawn ${v.withdrawnAt.slice(0, 10)}`} · {v.networkCount} network{v.networkCount === 1 ? "" : "s"}
            </li>
          ))}
      </ol>
    </SectionCard>
  );
}
