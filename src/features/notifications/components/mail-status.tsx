import { mailStatusLabels, type MailStatus } from '@shared/schemas/notifications';

const looks: Record<MailStatus, { glyph: string; className: string }> = {
  sent: { glyph: '✓', className: 'border-lichen bg-lichen/10 text-lichen-deep' },
  queued: { glyph: '⧗', className: 'border-indigo bg-indigo/8 text-indigo-deep' },
  sending: { glyph: '➤', className: 'border-indigo bg-indigo/8 text-indigo-deep' },
  failed: { glyph: '✕', className: 'border-madder bg-madder/8 text-madder-deep' },
  skipped: { glyph: '–', className: 'border-walnut/40 bg-linen-deep text-walnut' },
};

/** A message's status as a word and a glyph, the colour only adding to them. */
export function MailStatusBadge({ status }: { status: MailStatus }) {
  const look = looks[status];
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2.5 py-0.5 font-semibold ${look.className}`}
    >
      <span aria-hidden="true">{look.glyph}</span>
      {mailStatusLabels[status]}
    </span>
  );
}
