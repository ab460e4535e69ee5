import type { VerdictsVisibleTo } from '@shared/schemas/guilds';
import type { GuildDto } from '@shared/types';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';
import { useUpdateVerdictVisibility } from '../api/update-verdict-visibility';

const choices: { value: VerdictsVisibleTo; label: string; example: string }[] = [
  {
    value: 'officers',
    label: 'Coordinators and admins only',
    example: 'Members see that a block was measured, but not how it measured up.',
  },
  { value: 'guild', label: 'Everyone in the guild', example: 'Every member sees every block’s verdict on the board.' },
];

/** Admins choose who sees the verdicts on other makers' blocks; each maker always sees their own. */
export function VerdictVisibilityCard({ guild }: { guild: GuildDto }) {
  const update = useUpdateVerdictVisibility(guild.id);
  const current = update.isPending && update.variables ? update.variables : guild.verdictsVisibleTo;
  return (
    <Card title="Who sees measuring results">
      <fieldset>
        <legend className="mb-2">
          When a block is measured, its result (true to size, trim, short or skewed) is shown to its maker and to:
        </legend>
        <div className="flex flex-wrap gap-3">
          {choices.map((c) => (
            <label
              key={c.value}
              className={`flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border-2 px-4 py-2 ${current === c.value ? 'border-indigo bg-indigo/10' : 'border-walnut/30 bg-card'}`}
            >
              <input
                type="radio"
                name="verdicts-visible-to"
                className="h-5 w-5 shrink-0"
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
