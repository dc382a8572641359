/**
 * The account page: address and sign-out, profile, password. It is a column of independent sections;
 * other features add theirs (e.g. the API tokens panel) inside `#account-extra` below.
 */
import { Alert, Card } from "../../../components/ui/form";
import { useAccount } from "../../../features/account/api/get-account";
import { ProfileForm } from "../../../features/account/components/profile-form";
import { OrcidSection } from "../../../features/account/components/orcid-section";
import { PasswordForm } from "../../../features/account/components/password-form";
import { EmailStatus } from "../../../features/auth/components/email-status";
import { SignOutButton } from "../../../features/auth/components/sign-out-button";
import { requireSignedInLoader } from "../../../features/auth/utils/require-session";
import { ApiTokensPanel } from "../../../features/tokens/components/api-tokens-panel";

export const loader = requireSignedInLoader();

export function Component() {
  const account = useAccount();
  if (account.error) return <Alert tone="error">{account.error.message}</Alert>;
  if (!account.data) return <p role="status" className="text-stone-700">Loading your account…</p>;
  const a = account.data;
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold text-moss-700">Your account</h1>
          <p className="mt-1 text-stone-700">
            Signed in as <span className="font-semibold">{a.displayName}</span>, role <span className="font-semibold">{a.role}</span>, member since{" "}
            {new Date(a.createdAt).toISOString().slice(0, 10)}.
          </p>
        </div>
        <SignOutButton />
      </div>
      <Card title="E-mail address">
        <EmailStatus email={a.email} verified={a.emailVerified} />
      </Card>
      <OrcidSection profile={a} />
      {/* Remounts (fresh fields) when another account signs in or ORCID sign-in links or unlinks an iD; saving the
          form itself keeps it mounted so that its "saved" message stays. */}
      <ProfileForm key={`${a.id}-${a.orcidVerified}`} profile={a} />
      <PasswordForm />
      <div id="account-extra" className="space-y-6">
        {/* Sections of other features (e.g. API tokens) go here. */}
        <ApiTokensPanel />
      </div>
    </div>
  );
}
