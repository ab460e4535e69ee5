import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createInvitationSchema, roleLabels, type CreateInvitationInput } from '@shared/schemas/guilds';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';
import { useCreateInvitation, useInvitations, useRevokeInvitation } from '../api/invitations';
import { useInvitationLimits } from '../api/invitation-limits';

export function InviteCard({ guildId, canInviteOfficers }: { guildId: number; canInviteOfficers: boolean }) {
  const invitations = useInvitations(guildId);
  const create = useCreateInvitation(guildId);
  const revoke = useRevokeInvitation(guildId);
  const limits = useInvitationLimits(guildId);
  const left = limits.data?.remaining;
  const [formError, setFormError] = useState('');
  const [sentTo, setSentTo] = useState('');
  const { register, handleSubmit, setError, reset, formState } = useForm<CreateInvitationInput>({
    resolver: zodResolver(createInvitationSchema),
    defaultValues: { email: '', role: 'member', open: false },
  });
  const roleOptions = (canInviteOfficers ? (['member', 'coordinator', 'admin'] as const) : (['member'] as const)).map((r) => ({
    value: r,
    label: roleLabels[r],
  }));

  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    setSentTo('');
    try {
      const invitation = await create.mutateAsync(values);
      setSentTo(invitation.email);
      reset({ email: '', role: values.role, open: false });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email', 'role', 'open']));
    }
  });

  return (
    <Card title="Invite someone">
      <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-[2fr_1fr_auto] sm:items-end">
        {formError && (
          <div className="sm:col-span-3">
            <Alert tone="error">{formError}</Alert>
          </div>
        )}
        {sentTo && (
          <div className="sm:col-span-3">
            <Alert tone="success" title="Invitation sent">
              We e-mailed a link to {sentTo}. It works for 14 days.
            </Alert>
          </div>
        )}
        <TextField
          label="Their e-mail"
          type="email"
          autoComplete="off"
          error={formState.errors.email?.message}
          {...register('email')}
        />
        <SelectField label="Role" options={roleOptions} error={formState.errors.role?.message} {...register('role')} />
        {canInviteOfficers && (
          <label className="inline-flex min-h-11 cursor-pointer items-start gap-2 sm:order-last sm:col-span-3">
            <input type="checkbox" className="mt-1 size-6 shrink-0 accent-indigo" {...register('open')} />
            <span>
              <span className="font-semibold">Open link</span>: anyone signed in who has the link may join, not only the person at
              this address. Use it only for a link you pass on yourself.
            </span>
          </label>
        )}
        <Button type="submit" pending={create.isPending} pendingLabel="Sending…" disabled={left === 0}>
          Send invitation
        </Button>
      </form>
      {limits.data && (
        <p className="mt-4 text-base" aria-live="polite">
          {limits.data.remaining > 0 ? (
            <>
              You can send <strong>{limits.data.remaining}</strong> more{' '}
              {limits.data.remaining === 1 ? 'invitation' : 'invitations'} today.
            </>
          ) : (
            <strong>You have reached today’s limit of invitations. Try again tomorrow.</strong>
          )}{' '}
          Each person may send {limits.data.perInviterDay} a day and the guild {limits.data.perGuildDay} a day (sent today: you{' '}
          {limits.data.sentByYouToday}, the guild {limits.data.sentByGuildToday}). A link works for {limits.data.validDays} days,
          and only for the address it was sent to unless it is an open link.
        </p>
      )}
      {invitations.data && invitations.data.length > 0 && (
        <div className="mt-6">
          <h3 className="text-xl font-semibold">Waiting for an answer</h3>
          <ul className="mt-2 divide-y divide-walnut/10">
            {invitations.data.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <span className="font-semibold break-all">{i.email}</span> · {roleLabels[i.role]} · until{' '}
                  {new Date(i.expiresAt).toLocaleDateString()}
                  {i.open && <span className="font-semibold"> · Open link: anyone with it can join</span>}
                </span>
                <Button variant="quiet" onClick={() => revoke.mutate(i.id)}>
                  Withdraw<span className="sr-only"> the invitation to {i.email}</span>
                </Button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </Card>
  );
}
