import { Link } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSignUp } from "../api/sign-up";
import { useResendVerification } from "../api/resend-verification";
import { PASSWORD_HINT } from "../utils/links";
import { AuthPanel } from "./auth-panel";

export function SignUpForm() {
  const signUp = useSignUp();
  const resend = useResendVerification();
  const errors = fieldErrorsOf(signUp.error);

  if (signUp.isSuccess) {
    const email = signUp.data.user.email;
    return (
      <AuthPanel title="Check your e-mail">
        <Alert tone="success" title="Your account is created">
          We sent a confirmation link to <strong>{email}</strong>. Open it to confirm your address; the link works once and for 48 hours.
        </Alert>
        <p className="mt-4 text-stone-700">
          You can sign in straight away; depositing networks needs a confirmed address.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600" to={paths.signIn.href()}>
            Go to sign in
          </Link>
          <Button type="button" variant="secondary" busy={resend.isPending} onClick={() => resend.mutate(email)}>
            Send the link again
          </Button>
        </div>
        {resend.isSuccess && <p className="mt-3 text-sm text-moss-700" role="status">{resend.data.message}</p>}
      </AuthPanel>
    );
  }

  return (
    <AuthPanel
      title="Create an account"
      intro="An account lets you deposit networks and follow their review. Browsing and downloading need no account."
      footer={
        <p>
          Already have an account? <Link className="font-semibold text-moss-700 underline" to={paths.signIn.href()}>Sign in</Link>
        </p>
      }
    >
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          signUp.mutate({ displayName: String(f.get("displayName") ?? ""), email: String(f.get("email") ?? ""), password: String(f.get("password") ?? "") });
        }}
      >
        {signUp.error && <Alert tone="error" title="Your account was not created">{signUp.error.message}</Alert>}
        <TextField label="Your name" name="displayName" autoComplete="name" required hint="Shown to curators and on the datasets you deposit." error={errors.displayName} />
        <TextField label="E-mail address" name="email" type="email" autoComplete="email" required hint="We send a confirmation link here. Never shown publicly." error={errors.email} />
        <TextField label="Password" name="password" type="password" autoComplete="new-password" required hint={PASSWORD_HINT} error={errors.password} />
        <Button busy={signUp.isPending} className="w-full">
          {signUp.isPending ? "Creating your account…" : "Create account"}
        </Button>
      </form>
    </AuthPanel>
  );
}
