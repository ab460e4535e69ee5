import { useEffect, useRef } from 'react';
import { Link, NavLink, Outlet, useLocation } from 'react-router';
import { useMe } from '@/entities/me/api/get-me';
import { useLogout } from '@/features/auth/api/auth-mutations';
import { useQueuedIntakeSync } from '@/features/intake/offline/use-queued-intake-sync';
import { paths } from '@/lib/paths';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center rounded-lg px-3 font-semibold ${isActive ? 'bg-indigo text-white' : 'text-indigo hover:bg-linen-deep'}`;

export function BrandMark() {
  return (
    <span className="inline-flex items-center gap-2">
      <img src="/blockpost-mark.svg" alt="" className="h-9 w-9" />
      <span className="font-display text-2xl font-bold text-indigo-deep">Blockpost</span>
    </span>
  );
}

/**
 * After a client-side page change, focus moves to the page's content, as a full page load would reset
 * it, so keyboard and screen-reader users start at the new page rather than on a vanished button.
 */
function useFocusMainOnNavigation() {
  const { pathname } = useLocation();
  const mainRef = useRef<HTMLElement>(null);
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    mainRef.current?.focus({ preventScroll: false });
  }, [pathname]);
  return mainRef;
}

export function AppShell() {
  const me = useMe();
  const mainRef = useFocusMainOnNavigation();
  const logout = useLogout();
  const signedIn = Boolean(me.data);
  useQueuedIntakeSync(me.data?.user.id);
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:bg-card focus:p-3">
        Skip to the page
      </a>
      <header className="border-b border-walnut/15 bg-card print:hidden">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-3">
          <Link to={signedIn ? paths.guilds : paths.home} aria-label="Blockpost home">
            <BrandMark />
          </Link>
          <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
            {signedIn ? (
              <>
                <NavLink to={paths.guilds} className={navClass}>Guilds</NavLink>
                <NavLink to={paths.planner} className={navClass}>Cutting planner</NavLink>
                <NavLink to={paths.settings} className={navClass}>Settings</NavLink>
                <button
                  type="button"
                  className="inline-flex min-h-11 items-center rounded-lg px-3 font-semibold text-madder-deep hover:bg-linen-deep"
                  disabled={logout.isPending}
                  onClick={() => logout.mutate()}
                >
                  Sign out
                </button>
                {logout.isError && (
                  <p role="alert" className="w-full text-sm text-madder-deep">
                    Could not sign out: {logout.error.message}
                  </p>
                )}
              </>
            ) : (
              <>
                <NavLink to={paths.signIn} className={navClass}>Sign in</NavLink>
                <NavLink to={paths.register} className={navClass}>Create account</NavLink>
              </>
            )}
          </nav>
        </div>
      </header>
      <main id="main" ref={mainRef} tabIndex={-1} className="mx-auto max-w-6xl px-4 py-6 outline-none sm:py-10">
        <Outlet />
      </main>
    </div>
  );
}
