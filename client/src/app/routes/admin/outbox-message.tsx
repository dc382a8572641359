import { useParams } from "react-router-dom";
import { useSession } from "../../../features/auth/api/get-session";
import { NotAllowed } from "../../../features/auth/components/not-allowed";
import { hasRole, requireSignedInLoader } from "../../../features/auth/utils/require-session";
import { OutboxMessageView } from "../../../features/outbox/components/outbox-message";
import { paths } from "../../../config/paths";

export const loader = requireSignedInLoader();

export function Component() {
  const { data } = useSession();
  const { id } = useParams();
  if (!hasRole(data?.user, "admin")) return <NotAllowed min="admin" what="The outbox" />;
  return <OutboxMessageView id={Number(id)} backHref={paths.outbox.href()} />;
}
