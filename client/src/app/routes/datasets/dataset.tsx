/** Route modules of the dataset pages: the dataset feature's page with the signed-in role from the auth feature. */
import { useParams } from "react-router-dom";
import { useSession } from "../../../features/auth/api/get-session";
import { DatasetPage } from "../../../features/datasets/components/dataset-page";

export function Component() {
  const { accession = "", n } = useParams();
  const { data } = useSession();
  const role = data?.user?.role;
  const version = n !== undefined && /^\d+$/.test(n) ? Number(n) : null;
  return <DatasetPage key={`${accession}/${version ?? "latest"}`} accession={accession} version={version} isCurator={role === "curator" || role === "admin"} />;
}
