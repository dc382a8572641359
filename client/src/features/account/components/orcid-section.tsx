/** The Account page's ORCID section: the verified iD (linked through ORCID's sign-in), or a button to link one. */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useSearchParams } from "react-router-dom";
import { Alert, Button, Card } from "../../../components/ui/form";
import { OrcidButton } from "../../../components/ui/orcid-button";
import { apiFetch } from "../../../lib/api-client";
import { orcidErrorMessage } from "../../../lib/orcid";
import type { AccountProfile } from "@shared/types/auth";
import { accountKeys } from "../api/get-account";

export function OrcidSection({ profile }: { profile: AccountProfile }) {
  const [params] = useSearchParams();
  const qc = useQueryClient();
  const unlink = useMutation({
    mutationFn: () => apiFetch<AccountProfile>("/account/orcid", { method: "DELETE" }),
    onSuccess: (p) => qc.setQueryData(accountKeys.profile(), p),
  });
  const error = orcidErrorMessage(params.get("orcidError"));
  const linked = params.get("orcid") === "linked" && profile.orcidVerified;
  return (
    <Card title="ORCID iD">
      <div className="space-y-3">
        {error && <Alert tone="error" title="ORCID link refused">{error}</Alert>}
        {linked && <Alert tone="success">Your ORCID iD is linked and verified.</Alert>}
        {profile.orcidVerified ? (
          <>
            <p className="text-stone-800" data-testid="orcid-verified">
              <a className="font-mono text-moss-700 underline" href={`https://orcid.org/${profile.orcid}`} rel="noopener">
                {profile.orcid}
              </a>{" "}
              <span className="ml-1 rounded bg-moss-50 px-2 py-0.5 text-sm font-semibold text-moss-800 ring-1 ring-moss-600">✓ verified through ORCID</span>
            </p>
            <p className="text-sm text-stone-700">Datasets that list this iD for a creator show that creator as verified. You can also sign in with ORCID.</p>
            <Button variant="secondary" busy={unlink.isPending} onClick={() => unlink.mutate()}>
              Unlink this iD
            </Button>
          </>
        ) : (
          <>
            <p className="text-sm text-stone-700">
              {profile.orcid ? `The iD in your profile (${profile.orcid}) was typed, not verified. ` : ""}Link your iD through ORCID&apos;s sign-in: it proves the iD is yours, marks you as a verified creator on datasets that list it, and lets you sign in with ORCID.
            </p>
            <div className="max-w-xs">
              <OrcidButton intent="link" label="Link your ORCID iD" />
            </div>
          </>
        )}
      </div>
    </Card>
  );
}
