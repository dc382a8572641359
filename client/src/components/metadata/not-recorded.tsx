/** How pages show a field the depositor marked not recorded: the words and the reason, never a value. */
import { notRecordedReason, type NotRecordedField } from "@shared/validation/not-recorded";

export function NotRecorded({ reason }: { reason: string }) {
  return (
    <span className="italic text-stone-700">
      not recorded <span className="not-italic">({reason})</span>
    </span>
  );
}

/** The value when given, else "not recorded (reason)" when marked so, else null. */
export function ValueOrNotRecorded({ meta, field, value }: { meta: unknown; field: NotRecordedField; value: React.ReactNode }) {
  if (value !== undefined && value !== null && value !== "") return <>{value}</>;
  const reason = notRecordedReason(meta, field);
  return reason ? <NotRecorded reason={reason} /> : null;
}
