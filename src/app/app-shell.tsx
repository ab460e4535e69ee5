import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Link, NavLink, Outlet, useLocation } from 'react-router';
import { useMe } from '@/entities/me/api/get-me';
import { useLogout } from '@/features/auth/api/auth-mutations';
import { useQueuedIntakeSync } from '@/features/intake/offline/use-queued-intake-sync';
import { Loading } from '@/components/ui/page';
import { paths } from '@/lib/paths';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `flex min-h-11 items-center rounded-lg px-3 font-semibold ${isActive ? 'bg-indigo text-white' : 'text-indigo hover:bg-linen-deep'}`;

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

/**
 * The main links. On a phone they fold behind a Menu button (a disclosure: Escape closes it and gives
 * focus back to the button; following a link closes it); from the `md` width up they sit in the bar.
 */
function MainNav({ children }: { children: ReactNode }) {
  const [open, setOpen] = useState(false);
  const listId = useId();
  const buttonRef = useRef<HTMLButtonElement>(null);
  const { pathname } = useLocation();
  const [openedAt, setOpenedAt] = useState(pathname);
  if (open && openedAt !== pathname) {
    setOpen(false);
    setOpenedAt(pathname);
  }
  return (
    <nav
      aria-label="Main"
      onKeyDown={(e) => {
        if (e.key === 'Escape' && open) {
          setOpen(false);
          buttonRef.current?.focus();
        }
      }}
    >
      <button
        ref={buttonRef}
        type="button"
        className="inline-flex min-h-11 min-w-11 items-center gap-2 rounded-lg border-2 border-indigo px-3 font-semibold text-indigo hover:bg-linen-deep md:hidden"
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => {
          setOpen((o) => !o);
          setOpenedAt(pathname);
        }}
      >
        <span aria-hidden="true" className="text-xl leading-none">
          {open ? '×' : '☰'}
        </span>
        Menu
      </button>
      <ul
        id={listId}
        className={`${open ? 'flex' : 'hidden'} absolute inset-x-0 top-full z-20 flex-col gap-1 border-b border-walnut/15 bg-card px-4 pb-4 pt-2 shadow-md md:static md:flex md:flex-row md:items-center md:border-0 md:p-0 md:shadow-none`}
      >
        {children}
      </ul>
    </nav>
  );
}

export function AppShell({ hydrating = false }: { hydrating?: boolean }) {
  const me = useMe();
  const mainRef = useFocusMainOnNavigation();
  const logout = useLogout();
  const signedIn = Boolean(me.data);
  useQueuedIntakeSync(me.data?.user.id);
  return (
    <div className="min-h-screen">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:bg-card focus:p-3"
      >
        Skip to the page
      </a>
      <header className="relative border-b border-walnut/15 bg-card print:hidden">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-3">
          <Link
            to={signedIn ? paths.guilds : paths.home}
            aria-label="Blockpost home"
            className="inline-flex min-h-11 items-center"
          >
            <BrandMark />
          </Link>
          {!me.isPending && (
            <MainNav>
              {signedIn ? (
                <>
                  <li>
                    <NavLink to={paths.guilds} className={navClass}>
                      Home
                    </NavLink>
                  </li>
                  <li>
                    <NavLink to={paths.planner} className={navClass}>
                      Cutting planner
                    </NavLink>
                  </li>
                  <li>
                    <NavLink to={paths.settings} className={navClass}>
                      Settings
                    </NavLink>
                  </li>
                  <li>
                    <button
                      type="button"
                      className="flex min-h-11 w-full items-center rounded-lg px-3 font-semibold text-madder-deep hover:bg-linen-deep"
                      disabled={logout.isPending}
                      onClick={() => logout.mutate()}
                    >
                      Sign out
                    </button>
                  </li>
                  {logout.isError && (
                    <li role="alert" className="text-sm text-madder-deep">
                      Could not sign out: {logout.error.message}
                    </li>
                  )}
                </>
              ) : (
                <>
                  <li>
                    <NavLink to={paths.signIn} className={navClass}>
                      Sign in
                    </NavLink>
                  </li>
                  <li>
                    <NavLink to={paths.register} className={navClass}>
                      Create account
                    </NavLink>
                  </li>
                </>
              )}
            </MainNav>
          )}
        </div>
      </header>
      <main id="main" ref={mainRef} tabIndex={-1} className="mx-auto max-w-6xl px-4 py-6 outline-none sm:py-10">
        {hydrating ? <Loading /> : <Outlet />}
      </main>
    </div>
  );
}
