import { SignInForm } from "../../../features/auth/components/sign-in-form";

export function Component() {
  return <SignInForm />;
}
