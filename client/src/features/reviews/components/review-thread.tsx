/** The conversation between curators and the depositor about a submission. */
import { Alert } from "../../../components/ui/form";
import { SubmissionThread } from "../../../components/thread/submission-thread";
import { usePostReviewComment, useReviewThread } from "../api/thread";

export function ReviewThread({ versionId }: { versionId: number }) {
  const { data, error } = useReviewThread(versionId);
  const post = usePostReviewComment(versionId);
  if (error) return <Alert tone="error" title={`The conversation could not be loaded: ${error.message}`} />;
  if (!data) return null;
  return <SubmissionThread entries={data.entries} side={data.side} canComment={data.canComment} onSend={(b) => post.mutateAsync(b)} sending={post.isPending} error={post.error?.message ?? null} closedNote="The conversation opens when the depositor submits." />;
}
