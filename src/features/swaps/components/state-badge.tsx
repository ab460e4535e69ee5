import { blockStateLabels, swapStateShort, type BlockState, type SwapState } from '@shared/schemas/swaps';

const swapTone: Record<SwapState, string> = {
  draft: 'bg-linen-deep text-walnut',
  signup: 'bg-indigo text-white',
  sewing: 'bg-indigo-deep text-white',
  collecting: 'bg-weld/20 text-weld-deep',
  sorting: 'bg-plum/15 text-plum',
  complete: 'bg-lichen/20 text-lichen-deep',
  cancelled: 'bg-walnut/10 text-walnut-soft line-through',
};

export function SwapStateBadge({ state }: { state: SwapState }) {
  return <span className={`inline-flex rounded-full px-3 py-0.5 font-semibold ${swapTone[state]}`}>{swapStateShort[state]}</span>;
}

export function BlockStateText({ state }: { state: BlockState }) {
  return <span className="font-semibold">{blockStateLabels[state]}</span>;
}
