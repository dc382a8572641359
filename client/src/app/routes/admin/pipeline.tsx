import { useSession } from "../../../features/auth/api/get-session";
import { NotAllowed } from "../../../features/auth/components/not-allowed";
import { hasRole, requireSignedInLoader } from "../../../features/auth/utils/require-session";
import { PipelineAdmin } from "../../../features/pipeline/components/pipeline-admin";

export const loader = requireSignedInLoader();

export function Component() {
  const { data } = useSession();
  if (!hasRole(data?.user, "admin")) return <NotAllowed min="admin" what="The metrics pipeline" />;
  return <PipelineAdmin />;
}
