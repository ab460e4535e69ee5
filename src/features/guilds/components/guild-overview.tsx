import { Link, useParams } from 'react-router';
import { roleLabels } from '@shared/schemas/guilds';
import { Card } from '@/components/ui/card';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useGuild } from '@/entities/guild/api/get-guild';
import { DefaultUnitCard } from './default-unit-card';
import { TimeZoneCard } from './time-zone-card';
import { VerdictVisibilityCard } from './verdict-visibility-card';

/** The guild's front page until other sections fill it. */
export function GuildOverview() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  if (guild.isPending) return <Loading />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  return (
    <div className="space-y-6">
      <Card title="About this guild">
        <p>
          You are {roleLabels[guild.data.myRole].toLowerCase()} here. {guild.data.memberCount} members · deadlines shown in{' '}
          {guild.data.timeZone.replace(/_/g, ' ')} time.
        </p>
        <p className="mt-3">
          <Link className="font-semibold text-indigo underline" to={paths.members(guildId)}>
            See the members
          </Link>
        </p>
      </Card>
      {guild.data.myRole === 'admin' && <DefaultUnitCard guild={guild.data} />}
      {guild.data.myRole === 'admin' && <TimeZoneCard guild={guild.data} />}
      {guild.data.myRole === 'admin' && <VerdictVisibilityCard guild={guild.data} />}
    </div>
  );
}
