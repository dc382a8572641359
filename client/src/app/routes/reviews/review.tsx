import { useParams } from "react-router-dom";
import { ReviewPage } from "../../../features/reviews/components/review-page";
import { RequireUser } from "../deposits/require-user";

export function Component() {
  const { versionId } = useParams();
  return (
    <RequireUser min="curator">
      <ReviewPage key={versionId} versionId={Number(versionId)} />
    </RequireUser>
  );
}
