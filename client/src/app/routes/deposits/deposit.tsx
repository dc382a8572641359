import { useParams } from "react-router-dom";
import { DepositFlow } from "../../../features/deposits/components/deposit-flow";
import { RequireUser } from "./require-user";

export function Component() {
  const { versionId } = useParams();
  const id = versionId ? Number(versionId) : null;
  return (
    <RequireUser>
      <DepositFlow key={id ?? "new"} versionId={id !== null && Number.isInteger(id) ? id : null} />
    </RequireUser>
  );
}
