import type { QueryClient } from '@tanstack/react-query';
import type { BoardPatch } from '@shared/live-events';
import type { SwapDto } from '@shared/swap-types';
import { blockKeys } from '@/entities/block/api/block-keys';
import { swapKeys } from '@/entities/swap/api/swap-keys';

/**
 * After a board change, marks stale whatever else shows it, so open views refetch and closed ones do
 * on their next use: the blocks the change touched (and any block list holding one of them; an
 * officer's list of every block always), and the swap itself when its state or pledges moved. With no
 * patch, or a complete one, nothing can be ruled out, so all of them.
 */
export function markStaleAfterChange(queryClient: QueryClient, swapId: number, patch: BoardPatch | null) {
  const touched = patch && !patch.complete ? new Set(patch.rows.flatMap((r) => r.blocks.map((b) => b.id))) : null;
  const holdsTouched = (data: unknown) => Array.isArray(data) && data.some((b: { id?: number }) => touched?.has(b.id ?? -1));
  const swap = queryClient.getQueryData<SwapDto>(swapKeys.detail(swapId));
  const swapMoved = !patch || !swap || swap.state !== patch.swap.state || swap.pledged !== patch.totals.pledged;
  return Promise.all([
    swapMoved ? queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId), exact: true }) : undefined,
    queryClient.invalidateQueries({
      queryKey: blockKeys.lists(swapId),
      predicate: (q) => !touched || q.queryKey.at(-1) === 'all' || holdsTouched(q.state.data),
    }),
    queryClient.invalidateQueries({
      queryKey: blockKeys.all,
      predicate: (q) => !touched || touched.has(q.queryKey[2] as number),
    }),
  ]);
}
