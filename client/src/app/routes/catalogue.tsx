/** The Catalogue route: the catalogue page with the bundle actions (features meet here). */
import { CataloguePage } from "../../features/catalogue/components/catalogue-page";
import { BundleActions } from "../../features/bundles/components/bundle-actions";

export function Component() {
  return (
    <CataloguePage
      actions={({ selected, filter, total, dropFromSelection }) => <BundleActions selected={selected} filter={filter} total={total} onDropUnavailable={dropFromSelection} />}
    />
  );
}
