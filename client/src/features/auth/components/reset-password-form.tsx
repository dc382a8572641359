import { useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { ApiClientError } from "../../../lib/api-client";
import { paths } from "../../../config/paths";
import { useConfirmPasswordReset } from "../api/confirm-password-reset";
import { linkProblem, PASSWORD_HINT } from "../utils/links";
import { AuthPanel } from "./auth-panel";

export function ResetPasswordForm() {
  const [params] = useSearchParams();
  const token = params.get("token") ?? "";
  const reset = useConfirmPasswordReset();
  const [mismatch, setMismatch] = useState(false);
  const errors = fieldErrorsOf(reset.error);
  const linkError = reset.error instanceof ApiClientError && reset.error.code.startsWith("link_") ? linkProblem(reset.error, "password reset") : null;

  if (!token || linkError) {
    const p = linkError ?? { title: "This page needs the link from the e-mail", text: "Open the password reset link we sent you, or ask for a new one." };
    return (
      <AuthPanel title="Choose a new password">
        <Alert tone="error" title={p.title}>{p.text}</Alert>
        <p className="mt-6">
          <Link className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600" to={paths.forgotPassword.href()}>
            Ask for a new link
          </Link>
        </p>
      </AuthPanel>
    );
  }
  if (reset.isSuccess) {
    return (
      <AuthPanel title="Your password is changed">
        <Alert tone="success">{reset.data.message} Any other sessions of your account have been signed out.</Alert>
        <p className="mt-6">
          <Link className="rounded bg-moss-700 px-4 py-2 font-semibold text-white hover:bg-moss-600" to={paths.signIn.href()}>Sign in</Link>
        </p>
      </AuthPanel>
    );
  }
  return (
    <AuthPanel title="Choose a new password" intro="Choosing a new password signs your account out everywhere else.">
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          const password = String(f.get("password") ?? "");
          const again = String(f.get("again") ?? "");
          setMismatch(password !== again);
          if (password === again) reset.mutate({ token, password });
        }}
      >
        {reset.error && <Alert tone="error" title="Your password was not changed">{reset.error.message}</Alert>}
        <TextField label="New password" name="password" type="password" autoComplete="new-password" required hint={PASSWORD_HINT} error={errors.password} />
        <TextField label="New password again" name="again" type="password" autoComplete="new-password" required error={mismatch ? "The two passwords differ." : undefined} />
        <Button busy={reset.isPending} className="w-full">Set new password</Button>
      </form>
    </AuthPanel>
  );
}
