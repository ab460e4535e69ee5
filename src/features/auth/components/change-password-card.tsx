import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { changePasswordSchema, type ChangePasswordInput } from '@shared/schemas/auth';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';
import { useChangePassword } from '../api/change-password';
import { PasswordStrengthMeter } from './password-strength-meter';

/** Changing the password keeps this device signed in and signs every other one out. */
export function ChangePasswordCard({ email, displayName }: { email: string; displayName: string }) {
  const change = useChangePassword();
  const [formError, setFormError] = useState('');
  const [done, setDone] = useState('');
  const { register, handleSubmit, setError, formState, control, reset } = useForm<ChangePasswordInput>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });
  const newPassword = useWatch({ control, name: 'newPassword' });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    setDone('');
    try {
      const answer = await change.mutateAsync(values);
      reset();
      setDone(
        answer.signedOutElsewhere > 0
          ? `Your password is changed. ${answer.signedOutElsewhere} other ${answer.signedOutElsewhere === 1 ? 'device was' : 'devices were'} signed out.`
          : 'Your password is changed.',
      );
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['currentPassword', 'newPassword']));
    }
  });
  return (
    <Card title="Password">
      <form onSubmit={onSubmit} noValidate className="grid max-w-xl gap-4">
        <p>A new password signs you out on every other phone, tablet or computer; this one stays signed in.</p>
        {formError && <Alert tone="error">{formError}</Alert>}
        {done && <Alert tone="success">{done}</Alert>}
        <TextField
          label="Current password"
          type="password"
          autoComplete="current-password"
          error={formState.errors.currentPassword?.message}
          {...register('currentPassword')}
        />
        <div>
          <TextField
            label="New password"
            type="password"
            hint="At least 10 characters."
            autoComplete="new-password"
            error={formState.errors.newPassword?.message}
            {...register('newPassword')}
          />
          <PasswordStrengthMeter password={newPassword ?? ''} personal={[email, displayName]} />
        </div>
        <div>
          <Button type="submit" pending={change.isPending} pendingLabel="Changing…">
            Change password
          </Button>
        </div>
      </form>
    </Card>
  );
}
