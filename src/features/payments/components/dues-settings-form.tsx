import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { formatMoney, isKnownCurrency, minorDigits, parseMoney } from '@shared/schemas/payments';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';
import { useUpdateGuildPayments } from '../api/update-guild-payments';

interface Values {
  currency: string;
  amount: string;
  year: string;
}

/** The treasurer sets the guild's currency and this year's dues (amount typed as money, "25" or "25.00"). */
export function DuesSettingsForm({
  guildId,
  currency,
  dues,
}: {
  guildId: number;
  currency: string;
  dues: { amount: number; year: number } | null;
}) {
  const update = useUpdateGuildPayments(guildId);
  const [formError, setFormError] = useState('');
  const [saved, setSaved] = useState('');
  const digits = minorDigits(currency);
  const { register, handleSubmit, setError, formState } = useForm<Values>({
    defaultValues: {
      currency,
      amount: dues ? (dues.amount / 10 ** digits).toFixed(digits) : '',
      year: String(dues?.year ?? new Date().getFullYear()),
    },
  });

  const submit = handleSubmit(async (v) => {
    setFormError('');
    setSaved('');
    const code = v.currency.trim().toLowerCase();
    if (!isKnownCurrency(code))
      return setError('currency', { message: 'Give a three-letter currency code such as usd, cad, gbp or eur.' });
    let body: { currency: string; dues: { amount: number; year: number } | null } = { currency: code, dues: null };
    if (v.amount.trim() !== '') {
      const amount = parseMoney(v.amount, code);
      if (amount === null || amount <= 0) {
        return setError('amount', {
          message: `Give the dues as an amount such as 25 or 25.${'0'.repeat(minorDigits(code)) || '00'}, or leave it empty for no dues.`,
        });
      }
      const year = Number(v.year);
      if (!Number.isInteger(year))
        return setError('year', { message: 'Give the membership year as a whole number, such as 2027.' });
      body = { currency: code, dues: { amount, year } };
    }
    try {
      const guild = await update.mutateAsync(body);
      setSaved(
        guild.dues
          ? `Dues are ${formatMoney(guild.dues.amount, guild.currency)} for ${guild.dues.year}.`
          : 'The guild asks for no dues now.',
      );
    } catch (error) {
      // The form keeps what was typed; the server's words go beside the field they concern.
      const rest = applyServerErrors(error, setError, ['currency']);
      setFormError(rest);
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Currency"
          hint="Three letters, such as usd or cad. It cannot change once members have paid."
          autoComplete="off"
          maxLength={3}
          error={formState.errors.currency?.message}
          {...register('currency')}
        />
        <TextField
          label="Yearly dues"
          hint="Leave empty for no dues."
          inputMode="decimal"
          maxLength={12}
          error={formState.errors.amount?.message}
          {...register('amount')}
        />
        <TextField
          label="Membership year"
          inputMode="numeric"
          maxLength={4}
          error={formState.errors.year?.message}
          {...register('year')}
        />
      </div>
      {formError && (
        <Alert tone="error" title="The settings were not saved.">
          {formError}
        </Alert>
      )}
      {saved && (
        <Alert tone="success" title="Saved.">
          {saved}
        </Alert>
      )}
      <Button type="submit" pending={update.isPending} pendingLabel="Saving…">
        Save dues
      </Button>
    </form>
  );
}
