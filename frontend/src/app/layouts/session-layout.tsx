import { useQuery } from '@tanstack/react-query';
import { useRef } from 'react';
import { Navigate, NavLink, Outlet, useLocation, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router';
import { can } from '@schema/permissions';
import { meQuery, sameId, type Me, type Membership } from '@frontend/features/auth/api/get-me';
import { useSignOut } from '@frontend/features/auth/api/sign-out';
import { OrganizationSwitcher } from '@frontend/features/organizations/components/organization-switcher';
import { useOutbox } from '@frontend/features/outbox/api/get-outbox';
import { Brand } from '@frontend/components/brand';
import { CautionNote } from '@frontend/components/caution-note';
import { rememberOrganization } from '@frontend/lib/current-organization';
import { signInPath } from '@frontend/lib/safe-next';
import { organizationPages, pathInOrganization } from '../navigation';
import { canAnywhere, defaultMembership, requireSession, SessionContext } from '../session';

export async function sessionLoader({ request }: LoaderFunctionArgs) {
  return requireSession(request);
}

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `flex items-center gap-2 rounded px-2.5 py-1.5 text-sm no-underline hover:no-underline ${
    isActive ? 'bg-slate-800 font-medium text-white shadow-[inset_3px_0_0_var(--color-primary-400)]' : 'text-slate-300 hover:bg-slate-800/60 hover:text-white'
  }`;

/**
 * The frame for signed-in pages: sidebar (organization, navigation by role, the person and
 * sign-out) and the main region. When the session ends — sign-out here, or a 401 anywhere —
 * /api/me becomes null and this layout sends the person to the sign-in page.
 */
export function SessionLayout() {
  const { data: me } = useQuery(meQuery());
  const location = useLocation();
  const signingOut = useRef(false);

  if (!me) {
    const next = signingOut.current ? undefined : location.pathname + location.search;
    return <Navigate to={signInPath(next)} replace />;
  }

  return (
    <SessionContext value={me}>
      <div className="flex min-h-screen flex-col md:flex-row">
        <Sidebar me={me} onSigningOut={() => (signingOut.current = true)} />
        <div className="flex min-w-0 flex-1 flex-col">
          <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-5 py-6 md:px-8">
            <Outlet />
          </main>
          <footer className="mx-auto w-full max-w-6xl border-t border-slate-200 px-5 py-4 md:px-8">
            <CautionNote variant="footer" />
          </footer>
        </div>
      </div>
    </SessionContext>
  );
}

function Sidebar({ me, onSigningOut }: { me: Me; onSigningOut: () => void }) {
  const params = useParams();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();

  const inUrl = me.memberships.find((m) => sameId(m.organizationId, params.orgId));
  const current: Membership | undefined = inUrl ?? defaultMembership(me);
  const outboxAllowed = canAnywhere(me, 'outbox:read');
  const outbox = useOutbox({ enabled: outboxAllowed });

  function selectOrganization(organizationId: string) {
    const target = me.memberships.find((m) => sameId(m.organizationId, organizationId));
    if (!target) return;
    rememberOrganization(organizationId);
    navigate(pathInOrganization(location.pathname, organizationId, target.role));
  }

  return (
    <aside className="shrink-0 bg-slate-900 text-slate-200 md:sticky md:top-0 md:flex md:h-screen md:w-64 md:flex-col">
      <div className="flex items-center justify-between px-4 py-3 md:block md:py-4">
        <NavLink to="/" className="no-underline hover:no-underline">
          <Brand tone="light" />
        </NavLink>
      </div>
      <div className="border-y border-slate-800 px-4 py-3">
        <OrganizationSwitcher
          memberships={me.memberships}
          currentOrganizationId={current ? String(current.organizationId) : undefined}
          onSelect={selectOrganization}
        />
      </div>
      <nav aria-label="Main" className="flex-1 px-2 py-3">
        <ul className="flex flex-wrap gap-1 md:flex-col">
          {current &&
            organizationPages
              .filter((page) => can(current.role, page.permission))
              .map((page) => (
                <li key={page.path}>
                  {/* Only the overview needs an exact match; a group's page keeps "Exposure groups" marked. */}
                  <NavLink end={page.path === ''} to={`/orgs/${encodeURIComponent(String(current.organizationId))}${page.path}`} className={navLinkClass}>
                    {page.label}
                  </NavLink>
                </li>
              ))}
          {outboxAllowed && outbox.data && (
            <li>
              <NavLink to="/outbox" className={navLinkClass}>
                Outbox
                <span className="ml-auto rounded-full bg-slate-700 px-1.5 text-[11px] text-slate-200">{outbox.data.length}</span>
              </NavLink>
            </li>
          )}
        </ul>
      </nav>
      <div className="flex items-center justify-between gap-2 border-t border-slate-800 px-4 py-3 md:block">
        <div className="min-w-0">
          <p className="truncate text-sm font-medium text-white">{me.user.name}</p>
          <p className="truncate text-xs text-slate-400">{me.user.email}</p>
          <NavLink to="/account/notifications" className="text-xs text-slate-300 underline-offset-2 hover:text-white hover:underline">
            Notification settings
          </NavLink>
        </div>
        <button
          type="button"
          disabled={signOut.isPending}
          className="rounded border border-slate-700 px-2 py-1 text-xs font-medium text-slate-200 hover:border-slate-500 hover:bg-slate-800 hover:text-white disabled:text-slate-500 md:mt-2"
          onClick={() => {
            onSigningOut();
            signOut.mutate();
          }}
        >
          {signOut.isPending ? 'Signing out…' : 'Sign out'}
        </button>
      </div>
    </aside>
  );
}
