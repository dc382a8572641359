import { OrcidSignUpForm } from "../../../features/auth/components/orcid-sign-up-form";

export function Component() {
  return <OrcidSignUpForm />;
}
