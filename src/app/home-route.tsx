import { NextForMe } from '@/features/home/components/next-for-me';
import { GuildListPage } from '@/features/guilds/components/guild-list-page';
import { PageHeader } from '@/components/ui/page';

/** A signed-in person's first screen: what is next for them across every guild, then their guilds. */
export function HomeRoute() {
  return (
    <div className="space-y-12">
      <div>
        <PageHeader title="What’s next for you" lead="From all your guilds. Each item takes you to where it is done." />
        <NextForMe />
      </div>
      <GuildListPage />
    </div>
  );
}
