import { Navigate, Outlet, useLocation, useSearchParams } from 'react-router';
import { useMe } from '@/entities/me/api/get-me';
import { Loading, QueryError } from '@/components/ui/page';
import { paths, safeNext } from '@/lib/paths';

/** Pages behind sign-in send a signed-out visitor to sign in and back. */
export function RequireSignedIn() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <Loading />;
  if (me.isError) return <QueryError error={me.error} what="your account" />;
  if (!me.data)
    return <Navigate to={`${paths.signIn}?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <Outlet />;
}

/** Sign-in pages send a signed-in visitor on to where they were going, or their guilds. */
export function RedirectIfSignedIn() {
  const me = useMe();
  const [params] = useSearchParams();
  if (me.isPending) return <Loading />;
  if (me.data) return <Navigate to={safeNext(params.get('next'))} replace />;
  return <Outlet />;
}
