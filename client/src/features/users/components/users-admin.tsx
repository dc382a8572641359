import { useState } from "react";
import { useSearchParams } from "react-router-dom";
import { Alert, Button, SelectField, TextField } from "../../../components/ui/form";
import { ROLES, type Role, type UserSummary } from "@shared/types/auth";
import { useUsers } from "../api/get-users";
import { useChangeUserRole } from "../api/change-user-role";

const ROLE_OPTIONS = ROLES.map((r) => ({ value: r, label: r }));
const PAGE_SIZE = 25;

function RoleCell({ user, onDone }: { user: UserSummary; onDone: (msg: string | null, err: string | null) => void }) {
  const [role, setRole] = useState<Role>(user.role);
  const change = useChangeUserRole();
  return (
    <form
      className="flex items-center gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        change.mutate(
          { id: user.id, role },
          {
            onSuccess: (u) => onDone(`${u.displayName} is now ${u.role}.`, null),
            onError: (err) => {
              setRole(user.role);
              onDone(null, err.message);
            },
          },
        );
      }}
    >
      <SelectField label={`Role of ${user.displayName}`} hideLabel name="role" value={role} options={ROLE_OPTIONS} onChange={(e) => setRole(e.target.value as Role)} />
      <Button className="px-3 py-1.5 text-sm" variant="secondary" disabled={role === user.role} busy={change.isPending}>
        Change
      </Button>
    </form>
  );
}

/** The admin's list of accounts: filter by role or e-mail, page through, change a role (audited). */
export function UsersAdmin() {
  const [params, setParams] = useSearchParams();
  const role = (ROLES as readonly string[]).includes(params.get("role") ?? "") ? (params.get("role") as Role) : undefined;
  const email = params.get("email") ?? "";
  const page = Math.max(1, Number(params.get("page")) || 1);
  const users = useUsers({ role, email: email || undefined, page, pageSize: PAGE_SIZE });
  const [notice, setNotice] = useState<{ msg: string | null; err: string | null }>({ msg: null, err: null });
  const total = users.data?.meta.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  const setParam = (next: Record<string, string | undefined>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) p.set(k, v);
      else p.delete(k);
    }
    setParams(p);
  };

  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-bold text-moss-700">Users</h1>
        <p className="mt-1 text-stone-700">Appoint curators and admins. Every role change is written to the audit log; the last admin cannot be demoted.</p>
      </div>
      <form
        role="search"
        aria-label="Filter users"
        className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-stone-200"
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          setParam({ email: String(f.get("email") ?? "").trim() || undefined, role: String(f.get("role") ?? "") || undefined, page: undefined });
        }}
      >
        <TextField className="min-w-64 flex-1" label="E-mail contains" name="email" type="search" defaultValue={email} />
        <SelectField label="Role" name="role" defaultValue={role ?? ""} options={[{ value: "", label: "Any role" }, ...ROLE_OPTIONS]} />
        <Button>Filter</Button>
      </form>
      {notice.msg && <Alert tone="success">{notice.msg}</Alert>}
      {notice.err && <Alert tone="error" title="The role was not changed">{notice.err}</Alert>}
      {users.error && <Alert tone="error">{users.error.message}</Alert>}
      <div className="overflow-x-auto rounded-lg bg-white ring-1 ring-stone-200">
        <table className="min-w-full text-left text-sm">
          <caption className="sr-only">Accounts</caption>
          <thead className="border-b border-stone-200 bg-stone-50 text-stone-700">
            <tr>
              <th scope="col" className="px-4 py-2 font-semibold">Name</th>
              <th scope="col" className="px-4 py-2 font-semibold">E-mail</th>
              <th scope="col" className="px-4 py-2 font-semibold">Affiliation</th>
              <th scope="col" className="px-4 py-2 font-semibold">Joined</th>
              <th scope="col" className="px-4 py-2 font-semibold">Role</th>
            </tr>
          </thead>
          <tbody>
            {users.data?.data.map((u) => (
              <tr key={u.id} className="border-b border-stone-100 last:border-0">
                <td className="px-4 py-2 font-semibold text-stone-900">{u.displayName}</td>
                <td className="px-4 py-2 text-stone-800">
                  {u.email}
                  {!u.emailVerified && <span className="ml-2 rounded-full bg-lichen-300 px-2 py-0.5 text-xs font-semibold text-stone-900">unconfirmed</span>}
                </td>
                <td className="px-4 py-2 text-stone-700">{u.affiliation ?? "—"}</td>
                <td className="px-4 py-2 text-stone-700">{new Date(u.createdAt).toISOString().slice(0, 10)}</td>
                <td className="px-4 py-2">
                  <RoleCell key={`${u.id}-${u.role}`} user={u} onDone={(msg, err) => setNotice({ msg, err })} />
                </td>
              </tr>
            ))}
            {users.data && users.data.data.length === 0 && (
              <tr>
                <td colSpan={5} className="px-4 py-6 text-center text-stone-700">No account matches this filter.</td>
              </tr>
            )}
            {users.isPending && (
              <tr>
                <td colSpan={5} className="px-4 py-6 text-center text-stone-700">Loading…</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages of users" className="flex items-center justify-between text-sm text-stone-700">
        <p>
          {total} account{total === 1 ? "" : "s"} · page {page} of {pages}
        </p>
        <div className="flex gap-2">
          <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page <= 1} onClick={() => setParam({ page: String(page - 1) })}>
            Previous
          </Button>
          <Button type="button" variant="secondary" className="px-3 py-1.5 text-sm" disabled={page >= pages} onClick={() => setParam({ page: String(page + 1) })}>
            Next
          </Button>
        </div>
      </nav>
    </div>
  );
}
