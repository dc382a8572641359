import { Alert, Button } from "../../../components/ui/form";
import { useResendVerification } from "../api/resend-verification";

/** The account's address and whether it is confirmed, with a button for a new confirmation link. */
export function EmailStatus({ email, verified }: { email: string; verified: boolean }) {
  const resend = useResendVerification();
  return (
    <div className="space-y-3">
      <p className="text-stone-800">
        <span className="font-semibold">{email}</span>{" "}
        {verified ? (
          <span className="ml-1 rounded-full bg-moss-100 px-2 py-0.5 text-sm font-semibold text-moss-900">confirmed</span>
        ) : (
          <span className="ml-1 rounded-full bg-lichen-300 px-2 py-0.5 text-sm font-semibold text-stone-900">not confirmed yet</span>
        )}
      </p>
      {!verified && (
        <Alert tone="info" title="Confirm your address to deposit networks">
          <p>Open the link we sent to this address. It works for 48 hours.</p>
          {resend.isSuccess ? (
            <p className="mt-2 font-semibold" role="status">A new link is on its way.</p>
          ) : (
            <Button type="button" variant="secondary" className="mt-3" busy={resend.isPending} onClick={() => resend.mutate(undefined)}>
              Send a new confirmation link
            </Button>
          )}
        </Alert>
      )}
    </div>
  );
}
