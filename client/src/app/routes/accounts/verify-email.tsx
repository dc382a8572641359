import { VerifyEmailResult } from "../../../features/auth/components/verify-email-result";

export function Component() {
  return <VerifyEmailResult />;
}
