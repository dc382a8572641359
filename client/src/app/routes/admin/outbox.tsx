import { useSession } from "../../../features/auth/api/get-session";
import { NotAllowed } from "../../../features/auth/components/not-allowed";
import { hasRole, requireSignedInLoader } from "../../../features/auth/utils/require-session";
import { OutboxList } from "../../../features/outbox/components/outbox-list";
import { paths } from "../../../config/paths";

export const loader = requireSignedInLoader();

export function Component() {
  const { data } = useSession();
  if (!hasRole(data?.user, "admin")) return <NotAllowed min="admin" what="The outbox" />;
  return <OutboxList messageHref={(id) => paths.outboxMessage.href(id)} />;
}
