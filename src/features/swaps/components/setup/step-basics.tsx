import type { UseFormReturn } from 'react-hook-form';
import { TextArea, TextField } from '@/components/ui/fields';
import type { SetupValues } from './setup-values';

export function StepBasics({ form }: { form: UseFormReturn<SetupValues> }) {
  const { register, formState } = form;
  return (
    <div className="space-y-5">
      <TextField
        label="Title"
        hint="What members will call it, e.g. “Autumn Lanterns”."
        error={formState.errors.title?.message}
        {...register('title')}
      />
      <TextArea
        label="Description"
        hint="What the blocks are for and anything makers should know. Optional."
        rows={5}
        error={formState.errors.description?.message}
        {...register('description')}
      />
    </div>
  );
}
