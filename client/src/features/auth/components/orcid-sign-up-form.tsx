/** /sign-up/orcid — create an account from the ORCID iD just verified (the server keeps it 15 minutes). */
import { Link, useNavigate } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useOrcidPending, useSignUpWithOrcid } from "../api/orcid-sign-up";
import { AuthPanel } from "./auth-panel";

export function OrcidSignUpForm() {
  const pending = useOrcidPending();
  const signUp = useSignUpWithOrcid();
  const navigate = useNavigate();
  const errors = fieldErrorsOf(signUp.error);
  if (pending.isPending) return <p role="status">Reading your ORCID record…</p>;
  if (pending.isError) {
    return (
      <AuthPanel title="No ORCID iD waiting">
        <p className="text-stone-700">{pending.error.message}</p>
        <p className="mt-4">
          <Link className="font-semibold text-moss-700 underline" to={paths.signIn.href()}>Go to sign-in</Link>
        </p>
      </AuthPanel>
    );
  }
  const p = pending.data;
  return (
    <AuthPanel
      title="Create your account with ORCID"
      intro={
        <>
          ORCID confirmed your iD <span className="font-mono font-semibold" data-testid="pending-orcid">{p.orcid}</span>. Tanglebank needs an e-mail address for
          review notices; we send it a confirmation link.
        </>
      }
      footer={
        <p>
          Already have an account? <Link className="font-semibold text-moss-700 underline" to={paths.signIn.href()}>Sign in</Link>, then link your iD from the Account page.
        </p>
      }
    >
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          signUp.mutate({ email: String(f.get("email") ?? ""), displayName: String(f.get("displayName") ?? "") }, { onSuccess: () => navigate(paths.account.href(), { replace: true }) });
        }}
      >
        {signUp.error && Object.keys(errors).length === 0 && <Alert tone="error">{signUp.error.message}</Alert>}
        <TextField label="Name" name="displayName" autoComplete="name" required defaultValue={`${p.givenName} ${p.familyName}`.trim()} error={errors.displayName} />
        <TextField label="E-mail address" name="email" type="email" autoComplete="email" required error={errors.email} />
        <Button busy={signUp.isPending} className="w-full">
          Create my account
        </Button>
      </form>
    </AuthPanel>
  );
}
