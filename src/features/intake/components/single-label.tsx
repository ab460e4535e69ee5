import { useState } from 'react';
import { formatShortCode } from '@shared/block-reference';
import type { LabelSheetDataDto } from '@shared/schemas/intake';
import { Button } from '@/components/ui/button';

/** One label filling a phone screen, to show the coordinator's camera when there is no printer. */
export function SingleLabel({ data }: { data: LabelSheetDataDto }) {
  const [index, setIndex] = useState(0);
  const label = data.labels[Math.min(index, data.labels.length - 1)]!;
  const code = formatShortCode(label.shortCode);
  return (
    <div className="mx-auto max-w-md">
      <article className="rounded-card border-2 border-walnut/20 bg-white p-5 text-center text-black" data-testid="label">
        <img
          src={label.qr}
          alt={`QR code of block ${label.ordinal} of ${label.of}`}
          className="mx-auto aspect-square w-full max-w-80 [image-rendering:pixelated]"
        />
        <p className="mt-2 font-mono text-4xl font-bold tracking-widest" aria-label={`Short code ${code.split('').join(' ')}`}>
          {code}
        </p>
        <p className="mt-3 text-2xl font-bold">{data.swap.title}</p>
        <p className="text-xl">
          {label.makerName} · Block {label.ordinal} of {label.of}
        </p>
        <p className="text-walnut-soft">{data.swap.guildName}</p>
      </article>
      {data.labels.length > 1 && (
        <div className="mt-4 flex items-center justify-between gap-2 whitespace-nowrap">
          <Button variant="secondary" className="px-3" disabled={index === 0} onClick={() => setIndex((i) => i - 1)}>
            ← Previous
          </Button>
          <span>
            Label {index + 1} of {data.labels.length}
          </span>
          <Button
            variant="secondary"
            className="px-3"
            disabled={index >= data.labels.length - 1}
            onClick={() => setIndex((i) => i + 1)}
          >
            Next →
          </Button>
        </div>
      )}
    </div>
  );
}
