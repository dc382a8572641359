import { Alert, Button, Card, fieldErrorsOf, TextField } from "../../../components/ui/form";
import type { AccountProfile } from "@shared/types/auth";
import { useUpdateAccount } from "../api/update-account";

export function ProfileForm({ profile }: { profile: AccountProfile }) {
  const update = useUpdateAccount();
  const errors = fieldErrorsOf(update.error);
  return (
    <Card title="Profile">
      <form
        className="space-y-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          update.mutate({
            displayName: String(f.get("displayName") ?? ""),
            affiliation: String(f.get("affiliation") ?? "") || null,
            ...(profile.orcidVerified ? {} : { orcid: String(f.get("orcid") ?? "") || null }),
          });
        }}
      >
        {update.isSuccess && <Alert tone="success">Your profile is saved.</Alert>}
        {update.error && Object.keys(errors).length === 0 && <Alert tone="error">{update.error.message}</Alert>}
        <TextField label="Name" name="displayName" autoComplete="name" required defaultValue={profile.displayName} error={errors.displayName} />
        <TextField label="Affiliation" name="affiliation" autoComplete="organization" defaultValue={profile.affiliation ?? ""} hint="Institute, field station or group." error={errors.affiliation} />
        <TextField
          label="ORCID iD"
          name="orcid"
          defaultValue={profile.orcid ?? ""}
          placeholder="0000-0000-0000-0000"
          hint={profile.orcidVerified ? "Verified through ORCID (see above); unlink it there to change it." : "Optional. Offered when you list yourself as a creator of a dataset. Linking it through ORCID (above) verifies it."}
          disabled={profile.orcidVerified}
          error={errors.orcid}
        />
        <Button busy={update.isPending}>Save profile</Button>
      </form>
    </Card>
  );
}
