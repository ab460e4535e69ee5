import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router';
import { profileUpdateSchema, type ProfileUpdateInput } from '@shared/schemas/auth';
import { paths } from '@/lib/paths';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { SelectField, TextArea, TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { Loading, PageHeader } from '@/components/ui/page';
import { applyServerErrors } from '@/components/ui/form-errors';
import { useMe } from '@/entities/me/api/get-me';
import { useUpdateProfile } from '../api/auth-mutations';
import { ChangePasswordCard } from './change-password-card';

export function SettingsPage() {
  const me = useMe();
  if (!me.data) return <Loading />;
  return (
    <div className="space-y-6">
      <PageHeader title="Settings" lead="How Blockpost shows sizes to you, and what your guild sees." />
      <ProfileForm
        defaults={{
          displayName: me.data.user.displayName,
          // Not chosen yet: each guild's own unit applies, and saving the form keeps it that way.
          units: me.data.user.unitsChosen ? me.data.user.units : null,
          mailingAddress: me.data.user.mailingAddress ?? '',
        }}
      />
      <ChangePasswordCard email={me.data.user.email} displayName={me.data.user.displayName} />
      <Card title="E-mail">
        <p>Choose which messages Blockpost sends you: announcements, reminders, receipts and more.</p>
        <p className="mt-3">
          <Link className="font-semibold text-indigo underline" to={paths.mailPreferences}>
            Your e-mail choices
          </Link>
        </p>
      </Card>
      <Card title="Payments">
        <p>Dues and swap fees you paid through Blockpost, with their receipts and refunds.</p>
        <p className="mt-3">
          <Link className="font-semibold text-indigo underline" to={paths.myPayments}>
            Your payments
          </Link>
        </p>
      </Card>
    </div>
  );
}

function ProfileForm({ defaults }: { defaults: ProfileUpdateInput }) {
  const update = useUpdateProfile();
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState } = useForm<ProfileUpdateInput>({
    resolver: zodResolver(profileUpdateSchema),
    defaultValues: defaults,
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      await update.mutateAsync(values);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['displayName', 'units', 'mailingAddress']));
    }
  });
  return (
    <Card title="Your profile">
      <form onSubmit={onSubmit} noValidate className="grid max-w-xl gap-4">
        {formError && <Alert tone="error">{formError}</Alert>}
        {update.isSuccess && <Alert tone="success">Saved.</Alert>}
        <TextField label="Your name" error={formState.errors.displayName?.message} {...register('displayName')} />
        <SelectField
          label="Show lengths in"
          hint="A number typed without a unit is read in this unit too."
          options={[
            { value: '', label: 'As each of my guilds chooses' },
            { value: 'in', label: 'Inches and fractions (8½″)' },
            { value: 'mm', label: 'Millimetres (215.9 mm)' },
          ]}
          error={formState.errors.units?.message}
          {...register('units', { setValueAs: (v: string | null) => (v === '' || v === null ? null : v) })}
        />
        <TextArea
          label="Mailing address for posted blocks"
          hint="Only the coordinators of swaps you join see it, so blocks can come back to you by post."
          autoComplete="street-address"
          error={formState.errors.mailingAddress?.message}
          {...register('mailingAddress')}
        />
        <div>
          <Button type="submit" pending={update.isPending} pendingLabel="Saving…">
            Save
          </Button>
        </div>
      </form>
    </Card>
  );
}
