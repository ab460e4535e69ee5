import { useDeferredValue, useEffect, useMemo, useState } from 'react';
import type { PasswordStrength } from '@shared/password-strength';

type Rate = (password: string, personal?: string[]) => PasswordStrength;

const tone: Record<PasswordStrength['score'], string> = {
  0: 'bg-madder',
  1: 'bg-madder',
  2: 'bg-weld',
  3: 'bg-lichen',
  4: 'bg-lichen',
};

/**
 * How hard the password being typed is to guess, rated as the server rates it: four bars, a word, and
 * for a weak one the reason and a tip. The common-password dictionary is large, so it loads only
 * when a form with a new password is shown.
 */
export function PasswordStrengthMeter({ password, personal = [] }: { password: string; personal?: string[] }) {
  const [rate, setRate] = useState<Rate | null>(null);
  useEffect(() => {
    let live = true;
    void import('@shared/password-strength').then((m) => {
      if (live) setRate(() => m.passwordStrength);
    });
    return () => {
      live = false;
    };
  }, []);
  const typed = useDeferredValue(password);
  const personalKey = personal.join('\n');
  const result = useMemo(() => (rate && typed ? rate(typed, personalKey.split('\n')) : null), [rate, typed, personalKey]);

  return (
    <div className="mt-2" aria-live="polite">
      <div className="flex gap-1" aria-hidden="true">
        {[1, 2, 3, 4].map((step) => (
          <span
            key={step}
            className={`h-2 flex-1 rounded-full ${result && result.score >= step ? tone[result.score] : 'bg-walnut/15'}`}
          />
        ))}
      </div>
      {result ? (
        <p className="mt-1 text-base">
          <strong>Strength: {result.word}.</strong> {result.strong ? 'Hard to guess: good.' : `${result.reason} ${result.tip}`}
        </p>
      ) : (
        <p className="mt-1 text-base text-walnut-soft">
          Four or more unrelated words make a strong password that is easy to remember.
        </p>
      )}
    </div>
  );
}
