import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import type { GuildDto } from '@shared/types';
import { useUpdateVerdictVisibility } from '../api/update-verdict-visibility';
import { SettingChoiceCard, type SettingChoiceText } from './setting-choice-card';

const setting: SettingChoiceText<VerdictsVisibleTo> = {
  title: 'Who sees measuring results',
  legend: 'When a block is measured, its result (true to size, trim, short or skewed) is shown to its maker and to:',
  name: 'verdicts-visible-to',
  choices: [
    {
      value: 'officers',
      label: 'Coordinators and admins only',
      example: 'Members see that a block was measured, but not how it measured up.',
    },
    { value: 'guild', label: 'Everyone in the guild', example: 'Every member sees every block’s verdict on the board.' },
  ],
};

/** Admins choose who sees the verdicts on other makers' blocks; each maker always sees their own. */
export function VerdictVisibilityCard({ guild }: { guild: GuildDto }) {
  const update = useUpdateVerdictVisibility(guild.id);
  return <SettingChoiceCard {...setting} saved={guild.verdictsVisibleTo} update={update} />;
}
