import type { Units } from '@shared/schemas/auth';
import type { GuildDto } from '@shared/types';
import { useUpdateDefaultUnit } from '../api/update-default-unit';
import { SettingChoiceCard, type SettingChoiceText } from './setting-choice-card';

const setting: SettingChoiceText<Units> = {
  title: 'Lengths in this guild',
  legend: 'A number typed without a unit means, for members who have not chosen a unit of their own in Settings:',
  name: 'default-unit',
  choices: [
    { value: 'in', label: 'Inches', example: '“6 1/2” means 6½ inches' },
    { value: 'mm', label: 'Millimetres', example: '“165” means 165 mm' },
  ],
};

/** Admins choose the guild's default unit; members who chose their own in Settings keep theirs. */
export function DefaultUnitCard({ guild }: { guild: GuildDto }) {
  const update = useUpdateDefaultUnit(guild.id);
  return <SettingChoiceCard {...setting} saved={guild.defaultUnit} update={update} />;
}
