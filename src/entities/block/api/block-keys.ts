import { swapKeys } from '@/entities/swap/api/swap-keys';

/** Query keys of blocks: one block and its measurements under `all`; a swap's block lists under the swap's detail. */
export const blockKeys = {
  all: [...swapKeys.all, 'block'] as const,
  detail: (blockId: number) => [...blockKeys.all, blockId] as const,
  measurements: (blockId: number) => [...blockKeys.detail(blockId), 'measurements'] as const,
  lists: (swapId: number) => [...swapKeys.detail(swapId), 'blocks'] as const,
  list: (swapId: number, filter: string) => [...blockKeys.lists(swapId), filter] as const,
};

/** After a change to a swap's blocks: its detail, roster, block lists and every block query. */
export function invalidateSwapData(
  queryClient: { invalidateQueries: (f: { queryKey: readonly unknown[] }) => Promise<void> },
  swapId: number,
) {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId) }),
    queryClient.invalidateQueries({ queryKey: blockKeys.all }),
  ]);
}
