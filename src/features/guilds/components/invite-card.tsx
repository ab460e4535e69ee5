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

export function InviteCard({ guildId, canInviteOfficers }: { guildId: number; canInviteOfficers: boolean }) {
  const invitations = useInvitations(guildId);
  const create = useCreateInvitation(guildId);
  const revoke = useRevokeInvitation(guildId);
  const [formError, setFormError] = useState('');
  const [sentTo, setSentTo] = useState('');
  const { register, handleSubmit, setError, reset, formState } = useForm<CreateInvitationInput>({
    resolver: zodResolver(createInvitationSchema),
    defaultValues: { email: '', role: 'member' },
  });
  const roleOptions = (canInviteOfficers ? (['member', 'coordinator', 'admin'] as const) : (['member'] as const)).map((r) => ({ value: r, label: roleLabels[r] }));

  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    setSentTo('');
    try {
      const invitation = await create.mutateAsync(values);
      setSentTo(invitation.email);
      reset({ email: '', role: values.role });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email', 'role']));
    }
  });

  return (
    <Card title="Invite someone">
      <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-[2fr_1fr_auto] sm:items-end">
        {formError && <div className="sm:col-span-3"><Alert tone="error">{formError}</Alert></div>}
        {sentTo && <div className="sm:col-span-3"><Alert tone="success" title="Invitation sent">We e-mailed a link to {sentTo}. It works for 14 days.</Alert></div>}
        <TextField label="Their e-mail" type="email" autoComplete="off" error={formState.errors.email?.message} {...register('email')} />
        <SelectField label="Role" options={roleOptions} error={formState.errors.role?.message} {...register('role')} />
        <Button type="submit" pending={create.isPending} pendingLabel="Sending…">Send invitation</Button>
      </form>
      {invitations.data && invitations.data.length > 0 && (
        <div className="mt-6">
          <h3 className="text-xl font-semibold">Waiting for an answer</h3>
          <ul className="mt-2 divide-y divide-walnut/10">
            {invitations.data.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <span className="font-semibold break-all">{i.email}</span> · {roleLabels[i.role]} · until {new Date(i.expiresAt).toLocaleDateString()}
                </span>
                <Button variant="quiet" onClick={() => revoke.mutate(i.id)}>Withdraw<span className="sr-only"> the invitation to {i.email}</span></Button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </Card>
  );
}
