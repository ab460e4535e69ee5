import { NavLink, Outlet, useLocation, useParams } from 'react-router';
import { roleLabels } from '@shared/schemas/guilds';
import { useGuild } from '@/entities/guild/api/get-guild';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';

const tabClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center justify-center border-b-4 px-2 font-semibold sm:justify-start sm:px-3 ${isActive ? 'border-madder text-walnut' : 'border-transparent text-indigo hover:border-walnut/20'}`;

/** The guild's name, the caller's role and the guild's sections. */
export function GuildLayout() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  const { pathname } = useLocation();
  // Swaps is the guild's index: it stays marked on the swap pages below it, not on the other tabs.
  const onSwaps = pathname === paths.guild(guildId) || pathname.startsWith(`${paths.guild(guildId)}/swaps`);
  if (guild.isPending) return <Loading />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  return (
    <div>
      <div className="mb-6 print:hidden">
        <p className="text-walnut-soft">{roleLabels[guild.data.myRole]}</p>
        <h1 className="text-3xl font-bold text-indigo-deep sm:text-4xl">{guild.data.name}</h1>
        <nav aria-label="Guild sections" className="mt-4 grid grid-cols-3 gap-x-1 border-b border-walnut/15 sm:flex sm:flex-wrap">
          <NavLink end to={paths.guild(guildId)} className={() => tabClass({ isActive: onSwaps })}>
            Swaps
          </NavLink>
          <NavLink to={paths.about(guildId)} className={tabClass}>
            About
          </NavLink>
          <NavLink to={paths.members(guildId)} className={tabClass}>
            Members
          </NavLink>
          <NavLink to={paths.sewDays(guildId)} className={tabClass}>
            Sew days
          </NavLink>
          {(guild.data.dues || guild.data.myRole === 'admin') && (
            <NavLink to={paths.guildDues(guildId)} className={tabClass}>
              Dues
            </NavLink>
          )}
          {guild.data.myRole === 'admin' && (
            <NavLink to={paths.mailLog(guildId)} className={tabClass}>
              E-mail
            </NavLink>
          )}
        </nav>
      </div>
      <Outlet />
    </div>
  );
}
