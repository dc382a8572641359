import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSignIn } from "../api/sign-in";
import { useSession } from "../api/get-session";
import { safeNext } from "../utils/links";
import { AuthPanel } from "./auth-panel";
import { OrcidButton } from "../../../components/ui/orcid-button";
import { orcidErrorMessage } from "../../../lib/orcid";

export function SignInForm() {
  const [params] = useSearchParams();
  const next = safeNext(params.get("next"), paths.account.href());
  const navigate = useNavigate();
  const signIn = useSignIn();
  const errors = fieldErrorsOf(signIn.error);
  const session = useSession().data;
  const current = session?.user;
  const orcidOffered = session?.orcidSignIn ?? false;
  const orcidError = orcidErrorMessage(params.get("orcidError"));
  if (current && !signIn.isPending && !signIn.isSuccess) {
    return (
      <AuthPanel title="You are signed in">
        <p className="text-stone-700">
          You are signed in as <span className="font-semibold">{current.displayName}</span> ({current.email}). To use another account, sign out first.
        </p>
        <p className="mt-6">
          <Link className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600" to={next}>Continue</Link>
        </p>
      </AuthPanel>
    );
  }
  return (
    <AuthPanel
      title="Sign in"
      intro={params.get("next") ? "Sign in to continue to the page you asked for." : "Sign in to deposit networks, follow your submissions and manage API tokens."}
      footer={
        <>
          <p>
            New here? <Link className="font-semibold text-moss-700 underline" to={paths.signUp.href()}>Create an account</Link>
          </p>
          <p>
            <Link className="font-semibold text-moss-700 underline" to={paths.forgotPassword.href()}>Forgot your password?</Link>
          </p>
        </>
      }
    >
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          signIn.mutate(
            { email: String(f.get("email") ?? ""), password: String(f.get("password") ?? "") },
            { onSuccess: () => navigate(next, { replace: true }) },
          );
        }}
      >
        {orcidError && <Alert tone="error" title="ORCID sign-in refused">{orcidError}</Alert>}
        {signIn.error && <Alert tone="error" title="Could not sign you in">{signIn.error.message}</Alert>}
        <TextField label="E-mail address" name="email" type="email" autoComplete="email" required error={errors.email} />
        <TextField label="Password" name="password" type="password" autoComplete="current-password" required error={errors.password} />
        <Button busy={signIn.isPending} className="w-full">
          {signIn.isPending ? "Signing in…" : "Sign in"}
        </Button>
      </form>
      {orcidOffered && (
        <div className="mt-6 border-t border-stone-200 pt-4">
          <p className="mb-2 text-sm text-stone-700">Or use your ORCID iD: new here, you create your account from your ORCID record.</p>
          <OrcidButton intent="sign-in" next={params.get("next") ? next : undefined} label="Continue with ORCID" />
        </div>
      )}
    </AuthPanel>
  );
}
