import { useState } from 'react';
import { Link } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { mailCategories, mailChoicesSchema, type MailChoices, type MailPreferencesDto } from '@shared/schemas/notifications';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { Loading, PageHeader, QueryError } from '@/components/ui/page';
import { applyServerErrors } from '@/components/ui/form-errors';
import { paths } from '@/lib/paths';
import { useMailPreferences } from '../api/get-mail-preferences';
import { useUpdateMailPreferences } from '../api/update-mail-preferences';

/** Which kinds of e-mail the signed-in person wants. */
export function MailPreferencesPage() {
  const prefs = useMailPreferences();
  return (
    <div className="space-y-6">
      <PageHeader
        title="E-mail choices"
        lead="Blockpost e-mails you about your guilds' swaps. Keep the ones that help you and switch off the rest; you can change this any time."
      />
      {prefs.isPending && <Loading label="Loading your choices…" />}
      {prefs.isError && <QueryError error={prefs.error} what="your e-mail choices" />}
      {prefs.data && <ChoicesForm prefs={prefs.data} />}
      <p>
        <Link to={paths.settings} className="font-semibold text-indigo underline underline-offset-4">
          Back to settings
        </Link>
      </p>
    </div>
  );
}

function ChoicesForm({ prefs }: { prefs: MailPreferencesDto }) {
  const update = useUpdateMailPreferences();
  const [formError, setFormError] = useState('');
  const defaults = Object.fromEntries(prefs.categories.map((c) => [c.category, c.enabled])) as MailChoices;
  const { register, handleSubmit, setError, formState, reset } = useForm<MailChoices>({
    resolver: zodResolver(mailChoicesSchema),
    defaultValues: defaults,
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      const saved = await update.mutateAsync(values);
      reset(Object.fromEntries(saved.categories.map((c) => [c.category, c.enabled])) as MailChoices);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, mailCategories));
    }
  });
  return (
    <Card title="What we send you">
      <form onSubmit={onSubmit} noValidate className="max-w-2xl space-y-5">
        {formError && <Alert tone="error">{formError}</Alert>}
        {update.isSuccess && !formState.isDirty && (
          <Alert tone="success">Saved. We will send only the e-mails ticked below.</Alert>
        )}
        <p>
          We send to <strong className="break-all">{prefs.email}</strong>.
        </p>
        <fieldset className="space-y-3">
          <legend className="sr-only">Kinds of e-mail</legend>
          {prefs.categories.map((c) => (
            <label
              key={c.category}
              className="flex min-h-11 cursor-pointer items-start gap-4 rounded-lg border-2 border-walnut/15 bg-white p-4 hover:border-indigo/50"
            >
              <input type="checkbox" className="mt-1 h-6 w-6 shrink-0 accent-indigo" {...register(c.category)} />
              <span>
                <span className="block font-semibold">{c.label}</span>
                <span className="block text-walnut-soft">{c.description}</span>
                {formState.errors[c.category] && (
                  <span role="alert" className="block font-semibold text-madder-deep">
                    {formState.errors[c.category]?.message}
                  </span>
                )}
              </span>
            </label>
          ))}
        </fieldset>
        <p className="text-walnut-soft">
          Invitations and password resets always come, because they are about your account. Every other e-mail has a link at the
          bottom to stop that kind with one click.
        </p>
        <Button type="submit" pending={update.isPending} pendingLabel="Saving…" disabled={!formState.isDirty}>
          Save my choices
        </Button>
      </form>
    </Card>
  );
}
