import { quiltPlan } from '@shared/quilt';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { parseList, parseOne } from '../hooks/use-length-field';
import type { PlannerInputs } from '../hooks/use-planner-state';
import { formatYards } from './yards';
import type { LengthFormat } from './units';

const MAX_BLOCKS = 2000;

/** Layout, top size, binding, backing and batting for a number of blocks. Its inputs live in the page, so nothing typed is lost. */
export function QuiltPlanCard({
  blockFinished,
  blockCount,
  inputs,
  set,
  fmt,
  stale,
}: {
  blockFinished: { width: number; height: number };
  /** "How many blocks" above: the quilt follows it until the person types a number of their own. */
  blockCount: number;
  inputs: PlannerInputs;
  set(field: keyof PlannerInputs, value: string): void;
  fmt: LengthFormat;
  stale: boolean;
}) {
  const { units } = inputs;
  const following = inputs.quiltBlocks === '';
  const blocksText = following ? String(blockCount) : inputs.quiltBlocks.trim();
  const blocks = Number(blocksText);
  const acrossText = inputs.across.trim();
  const columns = acrossText === '' ? undefined : Number(acrossText);
  const sashing = parseOne(inputs.sashing, { units, allowZero: true });
  const binding = parseOne(inputs.binding, { units });
  const borders = parseList(inputs.borders, { units, allowEmpty: true });
  const blocksError =
    /^\d+$/.test(blocksText) && blocks >= 1 && blocks <= MAX_BLOCKS
      ? undefined
      : `Enter a whole number of blocks from 1 to ${MAX_BLOCKS}.`;
  const columnsError =
    columns === undefined || (/^\d+$/.test(acrossText) && columns >= 1 && columns <= blocks)
      ? undefined
      : `Enter a whole number from 1 to ${blocksError ? 'the number of blocks' : blocks}, or leave it empty.`;

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
          hint={following ? 'Follows “How many blocks” until you change it.' : undefined}
          inputMode="numeric"
          value={blocksText}
          onChange={(e) => set('quiltBlocks', e.target.value === '' ? ' ' : e.target.value)}
          error={blocksError}
        />
        <TextField
          label="Blocks across"
          hint="Leave empty for the layout closest to square."
          inputMode="numeric"
          value={inputs.across}
          onChange={(e) => set('across', e.target.value)}
          error={columnsError}
        />
        <TextField
          label="Sashing (finished width)"
          hint="Empty for none."
          unit={units}
          value={inputs.sashing}
          onChange={(e) => set('sashing', e.target.value)}
          error={sashing.error}
        />
        <TextField
          label="Borders (finished widths)"
          hint="Innermost first, separated by commas."
          unit={units}
          value={inputs.borders}
          onChange={(e) => set('borders', e.target.value)}
          error={borders.error}
        />
        <TextField
          label="Binding strip width"
          unit={units}
          value={inputs.binding}
          onChange={(e) => set('binding', e.target.value)}
          error={binding.error}
        />
      </div>
      {error && (
        <p role="alert" className="mt-4 font-semibold text-madder-deep">
          {error}
        </p>
      )}
      {plan && (
        <div className={`mt-6 ${stale ? 'rounded-lg border-2 border-dashed border-weld p-3' : ''}`}>
          {stale && (
            <p className="mb-2 font-semibold text-weld-deep">Out of date: worked out from the last block sizes that worked.</p>
          )}
          <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[auto_1fr]">
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
        </div>
      )}
    </Card>
  );
}
