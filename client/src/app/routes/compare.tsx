import { ComparePage } from "../../features/compare/components/compare-page";

export function Component() {
  return <ComparePage />;
}
