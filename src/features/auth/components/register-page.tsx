import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useSearchParams } from 'react-router';
import { registerSchema, type RegisterInput } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';
import { paths, safeNext } from '@/lib/paths';
import { useRegister } from '../api/auth-mutations';
import { AuthFrame } from './auth-frame';
import { SignInInstead } from './auth-links';
import { PasswordStrengthMeter } from './password-strength-meter';
import { CheckInbox } from './check-inbox';

export function RegisterPage() {
  const [params] = useSearchParams();
  const next = params.get('next');
  const registration = useRegister();
  const [formError, setFormError] = useState('');
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, control } = useForm<RegisterInput>({
    resolver: zodResolver(registerSchema),
  });
  const [password, email, displayName] = useWatch({ control, name: ['password', 'email', 'displayName'] });

  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      // Only a path of this site goes along; the link in the mail brings the person back to it.
      const back = next && safeNext(next) === next ? next : undefined;
      await registration.mutateAsync({ ...values, next: back });
      setSentTo(values.email);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email', 'password', 'displayName']));
    }
  });

  const signInLink = `${paths.signIn}${next ? `?next=${encodeURIComponent(next)}` : ''}`;

  if (sentTo) {
    return <CheckInbox email={sentTo} signInLink={signInLink} onChangeAddress={() => setSentTo(null)} />;
  }

  return (
    <AuthFrame
      title="Create your account"
      lead="One account for every guild you belong to. We will e-mail you a link to confirm your address."
      footer={<SignInInstead to={signInLink} />}
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {formError && <Alert tone="error">{formError}</Alert>}
        <TextField
          label="Your name"
          hint="As your guild knows you."
          autoComplete="name"
          error={formState.errors.displayName?.message}
          {...register('displayName')}
        />
        <TextField
          label="E-mail"
          type="email"
          autoComplete="email"
          error={formState.errors.email?.message}
          {...register('email')}
        />
        <div>
          <TextField
            label="Password"
            type="password"
            hint="At least 10 characters."
            autoComplete="new-password"
            error={formState.errors.password?.message}
            {...register('password')}
          />
          <PasswordStrengthMeter password={password ?? ''} personal={[email ?? '', displayName ?? '']} />
        </div>
        <Button type="submit" className="w-full" pending={registration.isPending} pendingLabel="Sending the link…">
          Create account
        </Button>
      </form>
    </AuthFrame>
  );
}
