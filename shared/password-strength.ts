/**
 * How hard a password is to guess, with the common-password dictionary of @zxcvbn-ts. The server
 * refuses a weak password with the reason and a tip; the forms show the same verdict as a meter.
 * The dictionary is large: the client imports this module lazily.
 */
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';

/** zxcvbn scores 0–4; below this a password is refused. 3: "safely unguessable", about 10^8 guesses or more. */
export const MIN_PASSWORD_SCORE = 3;

const checker = new ZxcvbnFactory({
  dictionary: { ...common.dictionary },
  graphs: common.adjacencyGraphs,
  // The estimate only looks at the first 100 characters, so a long password cannot make it slow.
  maxLength: 100,
});

const strengthWords = ['Very weak', 'Weak', 'Fair', 'Strong', 'Very strong'] as const;
export type StrengthWord = (typeof strengthWords)[number];

// zxcvbn's feedback keys, in our own words.
const warnings: Record<string, string> = {
  straightRow: 'Keys in a straight row on the keyboard are easy to guess.',
  keyPattern: 'A short pattern on the keyboard is easy to guess.',
  simpleRepeat: 'A character repeated over and over is easy to guess.',
  extendedRepeat: 'Repeated groups of characters are easy to guess.',
  sequences: 'Runs such as 1234 or abcd are easy to guess.',
  recentYears: 'Recent years are easy to guess.',
  dates: 'Dates are easy to guess.',
  topTen: 'This is one of the ten most used passwords.',
  topHundred: 'This is one of the hundred most used passwords.',
  common: 'This is a very common password.',
  similarToCommon: 'This is too close to a very common password.',
  wordByItself: 'A single word is easy to guess.',
  namesByThemselves: 'Names on their own are easy to guess.',
  commonNames: 'Common first and last names are easy to guess.',
  userInputs: 'Your name or e-mail address makes a password easy to guess.',
  pwned: 'This password has appeared in a data breach.',
};
const tips: Record<string, string> = {
  l33t: 'Swapping letters for look-alike numbers (a → 4) does not help much.',
  reverseWords: 'A word spelled backwards is still easy to guess.',
  allUppercase: 'Capitals in the middle help more than all capitals.',
  capitalization: 'Capitals in the middle help more than one at the start.',
  dates: 'Leave out dates that mean something to you.',
  recentYears: 'Leave out recent years.',
  associatedYears: 'Leave out years that belong to you.',
  sequences: 'Leave out runs such as 1234 or abcd.',
  repeated: 'Leave out repeated words and characters.',
  longerKeyboardPattern: 'Leave out patterns on the keyboard.',
  anotherWord: 'Add another word or two that do not belong together.',
  useWords: 'Try four unrelated words, such as “thimble orchard copper lantern”.',
  noNeed: 'You need no symbols, digits or capitals: length matters most.',
  pwned: 'Choose a password you have not used anywhere else.',
};

export interface PasswordStrength {
  /** 0 (very weak) to 4 (very strong). */
  score: 0 | 1 | 2 | 3 | 4;
  word: StrengthWord;
  strong: boolean;
  /** Why it is weak, in plain words; empty when strong. */
  reason: string;
  /** What to do instead. */
  tip: string;
}

/** Rates `password`; `personal` holds the person's name and e-mail, which make a password weak. */
export function passwordStrength(password: string, personal: string[] = []): PasswordStrength {
  const inputs = personal.flatMap((p) => [p, ...p.split(/[\s@.]+/)]).filter((p) => p.length >= 3);
  const result = checker.check(password, inputs);
  const score = result.score;
  const strong = score >= MIN_PASSWORD_SCORE;
  const warning = result.feedback.warning ? warnings[result.feedback.warning] : undefined;
  const suggestion = result.feedback.suggestions.map((s) => tips[s]).find(Boolean);
  return {
    score,
    word: strengthWords[score],
    strong,
    reason: strong ? '' : (warning ?? 'This password would be quick to guess.'),
    tip: strong ? '' : (suggestion ?? tips.useWords!),
  };
}
