import { Link, useSearchParams } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSession } from "../api/get-session";
import { useVerifyEmail } from "../api/verify-email";
import { useResendVerification } from "../api/resend-verification";
import { linkProblem } from "../utils/links";
import { AuthPanel } from "./auth-panel";

function ResendForm({ signedIn }: { signedIn: boolean }) {
  const resend = useResendVerification();
  const errors = fieldErrorsOf(resend.error);
  if (resend.isSuccess) return <Alert tone="success">{resend.data.message}</Alert>;
  return (
    <form
      className="mt-6 space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const email = signedIn ? undefined : String(new FormData(e.currentTarget).get("email") ?? "");
        resend.mutate(email);
      }}
    >
      {!signedIn && <TextField label="Your e-mail address" name="email" type="email" autoComplete="email" required error={errors.email} />}
      {resend.error && !errors.email && <Alert tone="error">{resend.error.message}</Alert>}
      <Button busy={resend.isPending}>Send me a new confirmation link</Button>
    </form>
  );
}

export function VerifyEmailResult() {
  const [params] = useSearchParams();
  const token = params.get("token") ?? "";
  const session = useSession();
  const signedIn = !!session.data?.user;
  const verify = useVerifyEmail(token);

  if (!token) {
    return (
      <AuthPanel title="Confirm your e-mail address" intro="Open the link in the e-mail we sent you. If it did not arrive, ask for a new one.">
        <ResendForm signedIn={signedIn} />
      </AuthPanel>
    );
  }
  if (verify.isPending) {
    return (
      <AuthPanel title="Confirming your e-mail address…">
        <p role="status" className="text-stone-700">One moment.</p>
      </AuthPanel>
    );
  }
  if (verify.isError) {
    const p = linkProblem(verify.error, "confirmation");
    return (
      <AuthPanel title="We could not confirm your address">
        <Alert tone="error" title={p.title}>{p.text}</Alert>
        {p.code === "link_used" ? (
          <p className="mt-4">
            <Link className="font-semibold text-moss-700 underline" to={signedIn ? paths.account.href() : paths.signIn.href()}>
              {signedIn ? "Go to your account" : "Sign in"}
            </Link>
          </p>
        ) : (
          <ResendForm signedIn={signedIn} />
        )}
      </AuthPanel>
    );
  }
  return (
    <AuthPanel title="Your e-mail address is confirmed">
      <Alert tone="success" title="Thank you">
        {verify.data.user.email} is confirmed. You can now deposit networks.
      </Alert>
      <p className="mt-6">
        <Link className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600" to={signedIn ? paths.account.href() : paths.signIn.href()}>
          {signedIn ? "Go to your account" : "Sign in"}
        </Link>
      </p>
    </AuthPanel>
  );
}
