import { useState, type ReactNode } from 'react';
import type { UseMutationResult } from '@tanstack/react-query';
import { Alert } from '@/components/ui/alert';
import { Card } from '@/components/ui/card';

export interface SettingChoice<T extends string> {
  value: T;
  label: string;
  example: string;
}

/** What a setting's card says: its title, question and choices. */
export interface SettingChoiceText<T extends string> {
  title: string;
  legend: ReactNode;
  /** The radio group's name, one per setting on the page. */
  name: string;
  choices: SettingChoice<T>[];
}

interface SettingChoiceCardProps<T extends string> extends SettingChoiceText<T> {
  saved: T;
  /** Saves the choice as soon as it is made. */
  update: UseMutationResult<unknown, Error, T>;
}

/** One guild setting chosen among a few options; the choice saves at once and says so. */
export function SettingChoiceCard<T extends string>({ title, legend, name, choices, saved, update }: SettingChoiceCardProps<T>) {
  // The choice just made shows as chosen from the click on, not only once the mutation has started
  // (a controlled radio would spring back meanwhile); a failed save shows the saved choice again.
  const [chosen, setChosen] = useState<T | null>(null);
  const current = chosen ?? saved;
  const choose = (value: T) => {
    setChosen(value);
    update.mutate(value, { onError: () => setChosen(null) });
  };
  return (
    <Card title={title}>
      <fieldset>
        <legend className="mb-2">{legend}</legend>
        <div className="flex flex-wrap gap-3">
          {choices.map((c) => (
            <label
              key={c.value}
              className={`flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border-2 px-4 py-2 ${current === c.value ? 'border-indigo bg-indigo/10' : 'border-walnut/30 bg-card'}`}
            >
              <input
                type="radio"
                name={name}
                className="h-5 w-5 shrink-0"
                checked={current === c.value}
                disabled={update.isPending}
                onChange={() => choose(c.value)}
              />
              <span>
                <span className="block font-semibold">{c.label}</span>
                <span className="block text-base text-walnut-soft">{c.example}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {update.isError && (
        <div className="mt-3">
          <Alert tone="error">{update.error.message}</Alert>
        </div>
      )}
      {update.isSuccess && !update.isPending && (
        <p className="mt-3" role="status">
          Saved.
        </p>
      )}
    </Card>
  );
}
