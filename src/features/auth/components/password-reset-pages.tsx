import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useSearchParams } from 'react-router';
import { z } from 'zod';
import { passwordSchema, resetRequestSchema, type ResetRequestInput } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';
import { paths } from '@/lib/paths';
import { useRequestReset, useResetPassword } from '../api/auth-mutations';
import { PasswordStrengthMeter } from './password-strength-meter';
import { AuthFrame } from './auth-frame';

export function ForgotPasswordPage() {
  const request = useRequestReset();
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState } = useForm<ResetRequestInput>({
    resolver: zodResolver(resetRequestSchema),
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      await request.mutateAsync(values);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email']));
    }
  });
  return (
    <AuthFrame
      title="Reset your password"
      lead="We will e-mail you a link that works once, for an hour."
      footer={
        <Link className="text-indigo underline" to={paths.signIn}>
          Back to sign in
        </Link>
      }
    >
      {request.isSuccess ? (
        <Alert tone="success" title="Check your e-mail">
          {request.data.message}
        </Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          {formError && <Alert tone="error">{formError}</Alert>}
          <TextField
            label="E-mail"
            type="email"
            autoComplete="email"
            error={formState.errors.email?.message}
            {...register('email')}
          />
          <Button type="submit" className="w-full" pending={request.isPending} pendingLabel="Sending…">
            Send the link
          </Button>
        </form>
      )}
    </AuthFrame>
  );
}

const newPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords are not the same.' });

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const reset = useResetPassword();
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState, control } = useForm<z.infer<typeof newPasswordSchema>>({
    resolver: zodResolver(newPasswordSchema),
  });
  const password = useWatch({ control, name: 'password' });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      await reset.mutateAsync({ token, password: values.password });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['password']));
    }
  });
  if (!token) {
    return (
      <AuthFrame title="Reset your password">
        <Alert tone="error" title="This link is incomplete">
          Open the link from the e-mail again, or{' '}
          <Link className="underline" to={paths.forgotPassword}>
            ask for a new one
          </Link>
          .
        </Alert>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title="Choose a new password">
      {reset.isSuccess ? (
        <Alert tone="success" title="Password changed">
          {reset.data.message}{' '}
          <Link className="font-semibold underline" to={paths.signIn}>
            Sign in
          </Link>
        </Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          {formError && <Alert tone="error">{formError}</Alert>}
          <div>
            <TextField
              label="New password"
              type="password"
              hint="At least 10 characters."
              autoComplete="new-password"
              error={formState.errors.password?.message}
              {...register('password')}
            />
            <PasswordStrengthMeter password={password ?? ''} />
          </div>
          <TextField
            label="New password again"
            type="password"
            autoComplete="new-password"
            error={formState.errors.confirm?.message}
            {...register('confirm')}
          />
          <Button type="submit" className="w-full" pending={reset.isPending} pendingLabel="Saving…">
            Save the new password
          </Button>
        </form>
      )}
    </AuthFrame>
  );
}
