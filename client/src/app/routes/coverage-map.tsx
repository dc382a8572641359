import { CoverageMapPage } from "../../features/coverage-map/components/coverage-map-page";

export function Component() {
  return <CoverageMapPage />;
}
