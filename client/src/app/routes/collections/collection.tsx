/** A collection's page, with the bundle button (features meet here). */
import { useParams, useSearchParams } from "react-router-dom";
import { CollectionPage } from "../../../features/collections/components/collection-page";
import { BundleActions } from "../../../features/bundles/components/bundle-actions";

export function Component() {
  const { code = "" } = useParams();
  const [params] = useSearchParams();
  const revision = Number(params.get("revision")) || undefined;
  return <CollectionPage code={code} revision={revision} bundle={(refs, title) => <BundleActions selected={refs} selectionLabel={title} />} />;
}
