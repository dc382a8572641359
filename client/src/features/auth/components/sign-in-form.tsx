import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSignIn } from "../api/sign-in";
import { safeNext } from "../utils/links";
import { AuthPanel } from "./auth-panel";

export function SignInForm() {
  const [params] = useSearchParams();
  const next = safeNext(params.get("next"), paths.account.href());
  const navigate = useNavigate();
  const signIn = useSignIn();
  const errors = fieldErrorsOf(signIn.error);
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
