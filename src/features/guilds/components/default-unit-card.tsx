import type { Units } from '@shared/schemas/auth';
import type { GuildDto } from '@shared/types';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { useUpdateDefaultUnit } from '../api/update-default-unit';

const choices: { value: Units; label: string; example: string }[] = [
  { value: 'in', label: 'Inches', example: '“6 1/2” means 6½ inches' },
  { value: 'mm', label: 'Millimetres', example: '“165” means 165 mm' },
];

/** Admins choose the guild's default unit; members who chose their own in Settings keep theirs. */
export function DefaultUnitCard({ guild }: { guild: GuildDto }) {
  const update = useUpdateDefaultUnit(guild.id);
  const current = update.isPending && update.variables ? update.variables : guild.defaultUnit;
  return (
    <Card title="Lengths in this guild">
      <fieldset>
        <legend className="mb-2">
          A number typed without a unit means, for members who have not chosen a unit of their own in Settings:
        </legend>
        <div className="flex flex-wrap gap-3">
          {choices.map((c) => (
            <label
              key={c.value}
              className={`flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border-2 px-4 py-2 ${current === c.value ? 'border-indigo bg-indigo/10' : 'border-walnut/30 bg-card'}`}
            >
              <input
                type="radio"
                name="default-unit"
                className="h-5 w-5"
                checked={current === c.value}
                disabled={update.isPending}
                onChange={() => update.mutate(c.value)}
              />
              <span>
                <span className="block font-semibold">{c.label}</span>
                <span className="block text-base text-walnut-soft">{c.example}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {update.isError && (
        <div className="mt-3">
          <Alert tone="error">{update.error.message}</Alert>
        </div>
      )}
      {update.isSuccess && !update.isPending && (
        <p className="mt-3" role="status">
          Saved.
        </p>
      )}
    </Card>
  );
}
