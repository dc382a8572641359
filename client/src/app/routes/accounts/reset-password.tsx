import { ResetPasswordForm } from "../../../features/auth/components/reset-password-form";

export function Component() {
  return <ResetPasswordForm />;
}
