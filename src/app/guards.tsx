import { Link, Navigate, Outlet, useLocation, useParams, useSearchParams } from 'react-router';
import { useMe } from '@/entities/me/api/get-me';
import { useGuild } from '@/entities/guild/api/get-guild';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
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

/**
 * A guild's admin-only pages (its e-mail history, its payments): anyone else who follows a link to one
 * is told whose page it is, instead of an empty form above a refusal.
 */
export function RequireGuildAdmin() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  if (guild.isPending) return <Loading />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  if (guild.data.myRole !== 'admin')
    return (
      <EmptyState title="This page is for the guild’s admins">
        <p>Ask an admin of {guild.data.name} if you need something from it.</p>
        <p className="mt-4">
          <Link className="font-semibold text-indigo underline" to={paths.guild(guildId)}>
            Back to the guild’s swaps
          </Link>
        </p>
      </EmptyState>
    );
  return <Outlet />;
}
