import { ReviewQueuePage } from "../../../features/reviews/components/review-queue-page";
import { RequireUser } from "../deposits/require-user";

export function Component() {
  return (
    <RequireUser min="curator">
      <ReviewQueuePage />
    </RequireUser>
  );
}
