import { useSession } from "../../../features/auth/api/get-session";
import { MyCollectionsPage } from "../../../features/collections/components/my-collections-page";

export function Component() {
  const { data } = useSession();
  return <MyCollectionsPage signedIn={!!data?.user} />;
}
