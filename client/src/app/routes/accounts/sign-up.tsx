import { SignUpForm } from "../../../features/auth/components/sign-up-form";

export function Component() {
  return <SignUpForm />;
}
