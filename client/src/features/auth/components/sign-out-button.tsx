import { useNavigate } from "react-router-dom";
import { Button } from "../../../components/ui/form";
import { paths } from "../../../config/paths";
import { useSignOut } from "../api/sign-out";

export function SignOutButton() {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <>
      <Button type="button" variant="danger" busy={signOut.isPending} onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate(paths.home.href()) })}>
        Sign out
      </Button>
      {signOut.error && <p role="alert" className="mt-2 text-sm text-red-800">{signOut.error.message}</p>}
    </>
  );
}
