/**
 * Personal API tokens on the Account page: create one (its secret is shown once, with a copy button),
 * see when each was last used, revoke.
 */
import { useState } from "react";
import { Alert, Button, Card, TextField, fieldErrorsOf } from "../../../components/ui/form";
import { useTokens } from "../api/get-tokens";
import { useCreateToken } from "../api/create-token";
import { useRevokeToken } from "../api/revoke-token";

const day = (iso: string | null) => (iso ? new Date(iso).toISOString().slice(0, 16).replace("T", " ") + " UTC" : "never");

export function ApiTokensPanel() {
  const tokens = useTokens();
  const create = useCreateToken();
  const revoke = useRevokeToken();
  const [secret, setSecret] = useState<{ name: string; value: string } | null>(null);
  const [copied, setCopied] = useState(false);
  const errors = fieldErrorsOf(create.error);

  return (
    <Card title="API tokens">
      <p className="text-sm text-stone-700">
        Scripts send a token as <code className="rounded bg-stone-100 px-1">Authorization: Bearer tb_…</code>. Reading the catalogue needs no token; a token gives your scripts
        their own rate-limit budget and access to your unpublished deposits. See the <a className="font-semibold text-moss-700 underline" href="/api-docs">API documentation</a>.
      </p>
      <form
        className="mt-4 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          const form = e.currentTarget;
          const name = String(new FormData(form).get("name") ?? "");
          setCopied(false);
          create.mutate(
            { name },
            {
              onSuccess: (r) => {
                setSecret({ name: r.token.name, value: r.secret });
                form.reset();
              },
            },
          );
        }}
      >
        <TextField className="min-w-64 flex-1" label="Token name" name="name" hint="What the token is for, e.g. “R scripts on my laptop”" error={errors.name} required maxLength={80} />
        <Button busy={create.isPending}>Create token</Button>
      </form>
      {create.error && !errors.name && <Alert tone="error">{create.error.message}</Alert>}
      {secret && (
        <div className="mt-4">
          <Alert tone="success" title={`Token “${secret.name}” created`}>
            <p>Copy it now: it will not be shown again.</p>
            <div className="mt-2 flex flex-wrap items-center gap-2">
              <code data-testid="new-token" className="rounded bg-white px-2 py-1 font-mono text-sm break-all text-stone-900 ring-1 ring-stone-300">
                {secret.value}
              </code>
              <Button
                type="button"
                variant="secondary"
                className="px-3 py-1 text-sm"
                onClick={() => {
                  void navigator.clipboard?.writeText(secret.value).then(() => setCopied(true));
                }}
              >
                {copied ? "Copied" : "Copy"}
              </Button>
            </div>
          </Alert>
        </div>
      )}
      {tokens.error && <Alert tone="error">{tokens.error.message}</Alert>}
      {tokens.data && (
        <div className="mt-4 overflow-x-auto">
          <table className="min-w-full text-left text-sm">
            <caption className="sr-only">Your API tokens</caption>
            <thead className="border-b border-stone-200 text-stone-700">
              <tr>
                <th scope="col" className="py-2 pr-3 font-semibold">Name</th>
                <th scope="col" className="py-2 pr-3 font-semibold">Starts with</th>
                <th scope="col" className="py-2 pr-3 font-semibold">Created</th>
                <th scope="col" className="py-2 pr-3 font-semibold">Last used</th>
                <th scope="col" className="py-2 font-semibold">Status</th>
              </tr>
            </thead>
            <tbody>
              {tokens.data.data.map((t) => (
                <tr key={t.id} className="border-b border-stone-100 last:border-0">
                  <td className="py-2 pr-3 font-semibold text-stone-900">{t.name}</td>
                  <td className="py-2 pr-3 font-mono text-stone-800">{t.prefix}…</td>
                  <td className="py-2 pr-3 text-stone-700">{day(t.createdAt)}</td>
                  <td className="py-2 pr-3 text-stone-700">{day(t.lastUsedAt)}</td>
                  <td className="py-2">
                    {t.revokedAt ? (
                      <span className="text-stone-700">revoked {day(t.revokedAt)}</span>
                    ) : (
                      <Button
                        type="button"
                        variant="danger"
                        className="px-3 py-1 text-sm"
                        busy={revoke.isPending && revoke.variables === t.id}
                        onClick={() => {
                          if (window.confirm(`Revoke “${t.name}”? Scripts using it will stop working.`)) revoke.mutate(t.id);
                        }}
                      >
                        Revoke <span className="sr-only">{t.name}</span>
                      </Button>
                    )}
                  </td>
                </tr>
              ))}
              {tokens.data.data.length === 0 && (
                <tr>
                  <td colSpan={5} className="py-3 text-stone-700">
                    No tokens yet.
                  </td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      )}
      {revoke.error && <Alert tone="error">{revoke.error.message}</Alert>}
    </Card>
  );
}
