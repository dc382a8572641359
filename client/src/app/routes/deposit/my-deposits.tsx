import { MyDepositsPage } from "../../../features/deposit/components/my-deposits-page";
import { RequireUser } from "./require-user";

export function Component() {
  return (
    <RequireUser>
      <MyDepositsPage />
    </RequireUser>
  );
}
