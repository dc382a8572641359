import { MyDepositsPage } from "../../../features/deposits/components/my-deposits-page";
import { RequireUser } from "./require-user";

export function Component() {
  return (
    <RequireUser>
      <MyDepositsPage />
    </RequireUser>
  );
}
