import { useState } from 'react';
import { quiltPlan } from '@shared/quilt';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { parseList, useLengthField } from '../hooks/use-length-field';
import { formatYards } from './yards';
import type { LengthFormat } from './units';

/** Layout, top size, binding, backing and batting for a number of blocks. */
export function QuiltPlanCard({
  blockFinished,
  defaultBlocks,
  fmt,
}: {
  blockFinished: { width: number; height: number };
  defaultBlocks: number;
  fmt: LengthFormat;
}) {
  const [blocksText, setBlocksText] = useState(String(defaultBlocks));
  const [columnsText, setColumnsText] = useState('');
  const sashing = useLengthField('', { allowZero: true });
  const [bordersText, setBordersText] = useState('');
  const binding = useLengthField('2 1/2');
  const blocks = Number(blocksText);
  const columns = columnsText.trim() === '' ? undefined : Number(columnsText);
  const borders = parseList(bordersText, true);
  const blocksError = Number.isInteger(blocks) && blocks >= 1 && blocks <= 2000 ? undefined : 'Enter a whole number of blocks.';
  const columnsError =
    columns === undefined || (Number.isInteger(columns) && columns >= 1 && columns <= blocks)
      ? undefined
      : 'Enter a whole number no larger than the block count, or leave it empty.';

  let plan: ReturnType<typeof quiltPlan> | null = null;
  let error = '';
  if (!blocksError && !columnsError && sashing.value !== null && borders.values && binding.value !== null) {
    try {
      plan = quiltPlan({
        blockFinished,
        blocks,
        columns,
        sashing: sashing.value || undefined,
        borders: borders.values,
        bindingWidth: binding.value,
      });
    } catch (e) {
      error = e instanceof Error ? e.message : 'That quilt cannot be laid out.';
    }
  }
  const size = (s: { width: number; height: number }) => `${fmt(s.width)} × ${fmt(s.height)}`;

  return (
    <Card title="The quilt">
      <div className="grid gap-4 md:grid-cols-3">
        <TextField
          label="Blocks in the quilt"
          inputMode="numeric"
          value={blocksText}
          onChange={(e) => setBlocksText(e.target.value)}
          error={blocksError}
        />
        <TextField
          label="Blocks across"
          hint="Leave empty for the layout closest to square."
          inputMode="numeric"
          value={columnsText}
          onChange={(e) => setColumnsText(e.target.value)}
          error={columnsError}
        />
        <TextField
          label="Sashing (finished width)"
          hint="Empty for none."
          value={sashing.text}
          onChange={(e) => sashing.setText(e.target.value)}
          error={sashing.error}
        />
        <TextField
          label="Borders (finished widths)"
          hint="Innermost first, separated by commas."
          value={bordersText}
          onChange={(e) => setBordersText(e.target.value)}
          error={borders.error}
        />
        <TextField
          label="Binding strip width"
          value={binding.text}
          onChange={(e) => binding.setText(e.target.value)}
          error={binding.error}
        />
      </div>
      {error && (
        <p role="alert" className="mt-4 font-semibold text-madder-deep">
          {error}
        </p>
      )}
      {plan && (
        <dl className="mt-6 grid gap-x-6 gap-y-2 sm:grid-cols-[auto_1fr]">
          <dt className="font-semibold">Layout</dt>
          <dd>
            {plan.layout.columns} across × {plan.layout.rows} down
            {plan.layout.emptyCells
              ? ` (${plan.layout.emptyCells} empty ${plan.layout.emptyCells === 1 ? 'place' : 'places'} to fill)`
              : ''}
          </dd>
          <dt className="font-semibold">Finished top</dt>
          <dd data-testid="top-size">{size(plan.top)}</dd>
          <dt className="font-semibold">Binding</dt>
          <dd>
            {plan.binding.strips} strips {fmt(plan.binding.stripWidth)} × WOF for {fmt(plan.binding.length)} of binding —{' '}
            {formatYards(plan.binding.yards)}
          </dd>
          <dt className="font-semibold">Backing</dt>
          <dd>
            {size(plan.backing)}: {plan.backing.panels} {plan.backing.panels === 1 ? 'width' : 'widths'} of fabric
            {plan.backing.seams === 'none' ? '' : `, ${plan.backing.seams} seams`} — {formatYards(plan.backing.yards)}
          </dd>
          <dt className="font-semibold">Batting</dt>
          <dd>{size(plan.batting)}</dd>
        </dl>
      )}
    </Card>
  );
}
