import { useRef, useState } from "react";
import { Alert, Button, Card, fieldErrorsOf, TextField } from "../../../components/ui/form";
import { useChangePassword } from "../api/change-password";

export function PasswordForm() {
  const change = useChangePassword();
  const [mismatch, setMismatch] = useState(false);
  const form = useRef<HTMLFormElement>(null);
  const errors = fieldErrorsOf(change.error);
  return (
    <Card title="Password">
      <form
        ref={form}
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          const newPassword = String(f.get("newPassword") ?? "");
          const again = String(f.get("again") ?? "");
          setMismatch(newPassword !== again);
          if (newPassword !== again) return;
          change.mutate({ currentPassword: String(f.get("currentPassword") ?? ""), newPassword }, { onSuccess: () => form.current?.reset() });
        }}
      >
        {change.isSuccess && <Alert tone="success">Your password is changed. Your other sessions were signed out.</Alert>}
        {change.error && Object.keys(errors).length === 0 && <Alert tone="error">{change.error.message}</Alert>}
        <TextField label="Current password" name="currentPassword" type="password" autoComplete="current-password" required error={errors.currentPassword} />
        <TextField label="New password" name="newPassword" type="password" autoComplete="new-password" required hint="At least 10 characters, with at least one letter and one digit." error={errors.newPassword} />
        <TextField label="New password again" name="again" type="password" autoComplete="new-password" required error={mismatch ? "The two passwords differ." : undefined} />
        <Button busy={change.isPending} variant="secondary">Change password</Button>
      </form>
    </Card>
  );
}
