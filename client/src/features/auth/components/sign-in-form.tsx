import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSignIn } from "../api/sign-in";
import { useSession } from "../api/get-session";
import { safeNext } from "../utils/links";
import { AuthPanel } from "./auth-panel";

export function SignInForm() {
  const [params] = useSearchParams();
  const next = safeNext(params.get("next"), paths.account.href());
  const navigate = useNavigate();
  const signIn = useSignIn();
  const errors = fieldErrorsOf(signIn.error);
  const current = useSession().data?.user;
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
        {signIn.error && <Alert tone="error" title="Could not sign you in">{signIn.error.message}</Alert>}
        <TextField label="E-mail address" name="email" type="email" autoComplete="email" required error={errors.email} />
        <TextField label="Password" name="password" type="password" autoComplete="current-password" required error={errors.password} />
        <Button busy={signIn.isPending} className="w-full">
          {signIn.isPending ? "Signing in…" : "Sign in"}
        </Button>
      </form>
    </AuthPanel>
  );
}
