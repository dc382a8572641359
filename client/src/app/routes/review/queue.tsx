import { ReviewQueuePage } from "../../../features/review/components/review-queue-page";
import { RequireUser } from "../deposit/require-user";

export function Component() {
  return (
    <RequireUser min="curator">
      <ReviewQueuePage />
    </RequireUser>
  );
}
