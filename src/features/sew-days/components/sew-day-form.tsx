import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { sewDayInputSchema, type SewDayFormValues, type SewDayInput } from '@shared/schemas/sewdays';
import { Button } from '@/components/ui/button';
import { TextArea, TextField } from '@/components/ui/fields';
import { Alert } from '@/components/ui/alert';
import { applyServerErrors } from '@/components/ui/form-errors';

const fields = ['title', 'startsAt', 'endsAt', 'place', 'videoUrl', 'notes'] as const;

interface SewDayFormProps {
  timeZone: string;
  defaultValues: SewDayFormValues;
  submitLabel: string;
  pendingLabel: string;
  onSubmit: (values: SewDayInput) => Promise<unknown>;
}

/** Scheduling and editing share this form; on a refusal the server's messages go beside the fields and nothing typed is lost. */
export function SewDayForm({ timeZone, defaultValues, submitLabel, pendingLabel, onSubmit }: SewDayFormProps) {
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState } = useForm<SewDayFormValues, unknown, SewDayInput>({
    resolver: zodResolver(sewDayInputSchema),
    defaultValues,
  });
  const errors = formState.errors;

  const submit = handleSubmit(async (values) => {
    setFormError('');
    try {
      await onSubmit(values);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, fields));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="grid gap-5 sm:grid-cols-2">
      {formError && (
        <div className="sm:col-span-2">
          <Alert tone="error">{formError}</Alert>
        </div>
      )}
      <TextField
        wrapperClassName="sm:col-span-2"
        label="Name of the sew day"
        autoComplete="off"
        error={errors.title?.message}
        {...register('title')}
      />
      <TextField
        label="Starts"
        type="datetime-local"
        hint={`In the guild’s time zone, ${timeZone}.`}
        error={errors.startsAt?.message}
        {...register('startsAt')}
      />
      <TextField
        label="Ends"
        type="datetime-local"
        hint="Same day or later."
        error={errors.endsAt?.message}
        {...register('endsAt')}
      />
      <TextField
        label="Place"
        hint="Address or room; leave empty for a video call only."
        autoComplete="off"
        error={errors.place?.message}
        {...register('place')}
      />
      <TextField
        label="Video call link"
        type="url"
        inputMode="url"
        hint="Starts with https://; optional."
        autoComplete="off"
        error={errors.videoUrl?.message}
        {...register('videoUrl')}
      />
      <TextArea
        wrapperClassName="sm:col-span-2"
        label="Notes"
        hint="What to bring, parking, who has the key."
        error={errors.notes?.message}
        {...register('notes')}
      />
      <div className="sm:col-span-2">
        <Button type="submit" pending={formState.isSubmitting} pendingLabel={pendingLabel}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
