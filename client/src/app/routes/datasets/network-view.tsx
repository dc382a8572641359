import { NetworkViewPage } from "../../../features/network-view/components/network-view-page";

export function Component() {
  return <NetworkViewPage />;
}
