import { NavLink, Outlet, useNavigation } from "react-router-dom";
import { useSession } from "../../features/auth/api/get-session";
import { paths } from "../../config/paths";
import { hasRole, type Role } from "@shared/types/auth";

interface NavItem {
  label: string;
  to: string;
  min?: Role;
}

const NAV: NavItem[] = [
  { label: "Catalogue", to: paths.catalogue.href() },
  { label: "Map", to: paths.coverageMap.href() },
  { label: "Compare", to: paths.compare.href() },
  { label: "Collections", to: paths.collections.href() },
  { label: "Deposit", to: paths.deposit.href(), min: "depositor" },
  { label: "My deposits", to: paths.myDeposits.href(), min: "depositor" },
  { label: "Review queue", to: paths.reviewQueue.href(), min: "curator" },
  { label: "Metrics pipeline", to: paths.pipeline.href(), min: "admin" },
  { label: "Users", to: paths.users.href(), min: "admin" },
  { label: "Outbox", to: paths.outbox.href(), min: "admin" },
];

function Logo() {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className="h-8 w-8">
      <rect width="32" height="32" rx="6" fill="#1f4d3a" />
      <g stroke="#e9c46a" strokeWidth="2" fill="none">
        <path d="M7 9 L25 23 M7 16 L25 9 M7 23 L25 16" />
      </g>
      <g fill="#f4f1e8">
        {[9, 16, 23].map((y) => (
          <g key={y}>
            <circle cx="7" cy={y} r="2.6" />
            <circle cx="25" cy={y} r="2.6" />
          </g>
        ))}
      </g>
    </svg>
  );
}

export function AppLayout() {
  const { data } = useSession();
  const user = data?.user ?? null;
  const navigation = useNavigation();
  const items = NAV.filter((i) => !i.min || hasRole(user, i.min));
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b-4 border-lichen-400 bg-moss-700 text-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <NavLink to={paths.home.href()} className="flex items-center gap-2 text-xl font-bold tracking-tight">
            <Logo />
            Tanglebank
          </NavLink>
          <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
            {items.map((i) => (
              <NavLink
                key={i.to}
                to={i.to}
                className={({ isActive }) =>
                  `rounded px-3 py-1.5 text-sm font-semibold ${isActive ? "bg-moss-900 text-lichen-300" : "text-moss-50 hover:bg-moss-600"}`
                }
              >
                {i.label}
              </NavLink>
            ))}
          </nav>
          <div className="flex items-center gap-2 text-sm">
            {user ? (
              <NavLink to={paths.account.href()} className="rounded px-3 py-1.5 font-semibold text-moss-50 hover:bg-moss-600">
                {user.displayName} <span className="text-lichen-300">({user.role})</span>
              </NavLink>
            ) : (
              <>
                <NavLink to={paths.signIn.href()} className="rounded px-3 py-1.5 font-semibold text-moss-50 hover:bg-moss-600">
                  Sign in
                </NavLink>
                <NavLink to={paths.signUp.href()} className="rounded bg-lichen-400 px-3 py-1.5 font-semibold text-moss-900 hover:bg-lichen-300">
                  Create account
                </NavLink>
              </>
            )}
          </div>
        </div>
        {navigation.state === "loading" && <div className="h-1 animate-pulse bg-lichen-300" role="progressbar" aria-label="Loading page" />}
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-6">
        <Outlet />
      </main>
      <footer className="border-t border-stone-200 bg-white py-4 text-center text-sm text-stone-600">
        Tanglebank — interaction networks with reproducible metrics. Data licences: CC0-1.0 or CC-BY-4.0 as stated on each dataset.
      </footer>
    </div>
  );
}
