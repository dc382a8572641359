import { Link } from "react-router-dom";
import { Alert, Button, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useRequestPasswordReset } from "../api/request-password-reset";
import { AuthPanel } from "./auth-panel";

export function ForgotPasswordForm() {
  const req = useRequestPasswordReset();
  const errors = fieldErrorsOf(req.error);
  return (
    <AuthPanel
      title="Forgot your password?"
      intro="Give the e-mail address of your account and we send you a link to choose a new password."
      footer={<p><Link className="font-semibold text-moss-700 underline" to={paths.signIn.href()}>Back to sign in</Link></p>}
    >
      {req.isSuccess ? (
        <Alert tone="success" title="Check your e-mail">{req.data.message}</Alert>
      ) : (
        <form
          className="space-y-4"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            req.mutate(String(new FormData(e.currentTarget).get("email") ?? ""));
          }}
        >
          {req.error && !errors.email && <Alert tone="error">{req.error.message}</Alert>}
          <TextField label="E-mail address" name="email" type="email" autoComplete="email" required error={errors.email} />
          <Button busy={req.isPending} className="w-full">Send me a reset link</Button>
        </form>
      )}
    </AuthPanel>
  );
}
