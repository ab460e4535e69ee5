import { useWatch, type UseFormReturn } from 'react-hook-form';
import { SelectField, TextField } from '@/components/ui/fields';
import { useMembers } from '@/entities/guild/api/get-members';
import type { SetupValues } from './setup-values';

/** Quota, the two dates in the guild's time zone, reminder days and what happens to the blocks. */
export function StepSchedule({
  form,
  guildId,
  timeZone,
  scheduleOnly,
}: {
  form: UseFormReturn<SetupValues>;
  guildId: number;
  timeZone: string;
  scheduleOnly: boolean;
}) {
  const { register, formState } = form;
  const e = formState.errors;
  const mode = useWatch({ control: form.control, name: 'mode' });
  const recipientKind = useWatch({ control: form.control, name: 'recipientKind' });
  const currency = useWatch({ control: form.control, name: 'fees.currency' }).toUpperCase();
  const members = useMembers(guildId);
  const number = { valueAsNumber: true } as const;

  return (
    <div className="space-y-6">
      {!scheduleOnly && (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-xl font-semibold text-indigo-deep">Blocks per member</legend>
          <TextField
            label="Fewest"
            type="number"
            min={1}
            max={50}
            error={e.quotaMin?.message}
            {...register('quotaMin', number)}
          />
          <TextField label="Most" type="number" min={1} max={50} error={e.quotaMax?.message} {...register('quotaMax', number)} />
        </fieldset>
      )}
      {!scheduleOnly && (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-xl font-semibold text-indigo-deep">Fees (optional)</legend>
          <TextField
            label="Entry fee"
            hint="Asked of every member who signs up; paid online. Leave empty for none."
            inputMode="decimal"
            maxLength={12}
            unit={currency}
            error={e.fees?.entry?.message}
            {...register('fees.entry')}
          />
          <TextField
            label="Return postage"
            hint="Asked only of members who post their blocks in. Leave empty for none."
            inputMode="decimal"
            maxLength={12}
            unit={currency}
            error={e.fees?.postage?.message}
            {...register('fees.postage')}
          />
        </fieldset>
      )}
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-xl font-semibold text-indigo-deep">Dates ({timeZone} time)</legend>
        <TextField label="Sign-up closes" type="datetime-local" error={e.signupCloses?.message} {...register('signupCloses')} />
        <TextField label="Blocks due" type="datetime-local" error={e.due?.message} {...register('due')} />
        <TextField
          label="Remind about sign-up, days before it closes"
          type="number"
          min={0}
          max={60}
          error={e.signupReminderDays?.message}
          {...register('signupReminderDays', number)}
        />
        <TextField
          label="Remind about blocks, days before they are due"
          type="number"
          min={0}
          max={60}
          error={e.dueReminderDays?.message}
          {...register('dueReminderDays', number)}
        />
      </fieldset>
      {!scheduleOnly && (
        <fieldset className="space-y-4">
          <legend className="mb-2 text-xl font-semibold text-indigo-deep">What happens to the blocks</legend>
          <SelectField
            label="Mode"
            options={[
              { value: 'return', label: 'Return: each maker gets back as many blocks as they had accepted' },
              { value: 'gift', label: 'Gift: all blocks go to one recipient, such as a charity quilt' },
            ]}
            error={e.mode?.message}
            {...register('mode')}
          />
          {mode === 'gift' && (
            <>
              <SelectField
                label="Recipient"
                options={[
                  { value: 'name', label: 'Someone outside the guild (type a name)' },
                  { value: 'member', label: 'A guild member' },
                ]}
                {...register('recipientKind')}
              />
              {recipientKind === 'member' ? (
                <SelectField
                  label="Member who receives the blocks"
                  options={[
                    { value: '', label: members.isPending ? 'Loading members…' : 'Choose a member' },
                    ...(members.data ?? []).map((m) => ({ value: String(m.userId), label: m.displayName })),
                  ]}
                  error={e.giftRecipientId?.message}
                  {...register('giftRecipientId')}
                />
              ) : (
                <TextField
                  label="Name of the recipient"
                  hint="e.g. a hospice, a shelter or a raffle"
                  error={e.giftRecipientName?.message}
                  {...register('giftRecipientName')}
                />
              )}
            </>
          )}
        </fieldset>
      )}
    </div>
  );
}
