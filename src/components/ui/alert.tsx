import type { ReactNode } from 'react';

const tones = {
  info: 'border-indigo bg-indigo/8 text-indigo-deep',
  success: 'border-lichen bg-lichen/10 text-lichen-deep',
  warning: 'border-weld bg-weld/10 text-weld-deep',
  error: 'border-madder bg-madder/8 text-madder-deep',
} as const;

const words = { info: 'Note', success: 'Done', warning: 'Take care', error: 'Problem' } as const;

/** A message box that says its tone in words too, never by colour alone. */
export function Alert({
  tone = 'info',
  title,
  children,
}: {
  tone?: keyof typeof tones;
  title?: ReactNode;
  children?: ReactNode;
}) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border-l-4 px-4 py-3 ${tones[tone]}`}>
      <p className="font-semibold">{title ?? words[tone]}</p>
      {children && <div>{children}</div>}
    </div>
  );
}
