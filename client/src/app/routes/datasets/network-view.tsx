import { NetworkViewPage } from "../../../features/network-views/components/network-view-page";

export function Component() {
  return <NetworkViewPage />;
}
