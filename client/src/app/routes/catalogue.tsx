/** The Catalogue route: the catalogue page with the bundle and collection actions (features meet here). */
import { CataloguePage } from "../../features/catalogue/components/catalogue-page";
import { BundleActions } from "../../features/bundles/components/bundle-actions";
import { SaveCollection } from "../../features/collections/components/save-collection";
import { useSession } from "../../features/auth/api/get-session";

export function Component() {
  const { data } = useSession();
  return (
    <CataloguePage
      actions={({ selected, filter, total, dropFromSelection }) => (
        <>
          <BundleActions selected={selected} filter={filter} total={total} onDropUnavailable={dropFromSelection} />
          <SaveCollection signedIn={!!data?.user} selected={selected} filter={filter} total={total} />
        </>
      )}
    />
  );
}
