/** Query keys of the swaps feature: all → lists → detail → roster / blocks / transitions. */
export const swapKeys = {
  all: ['swaps'] as const,
  lists: () => [...swapKeys.all, 'list'] as const,
  list: (guildId: number) => [...swapKeys.lists(), guildId] as const,
  details: () => [...swapKeys.all, 'detail'] as const,
  detail: (swapId: number) => [...swapKeys.details(), swapId] as const,
  transitions: (swapId: number) => [...swapKeys.detail(swapId), 'transitions'] as const,
  roster: (swapId: number) => [...swapKeys.detail(swapId), 'roster'] as const,
  blocks: (swapId: number, filter: string) => [...swapKeys.detail(swapId), 'blocks', filter] as const,
  block: (blockId: number) => [...swapKeys.all, 'block', blockId] as const,
  measurements: (blockId: number) => [...swapKeys.block(blockId), 'measurements'] as const,
  members: (guildId: number) => [...swapKeys.all, 'members', guildId] as const,
};

/** After a change to a swap's blocks: its detail, roster, block lists and every block query. */
export function invalidateSwapData(queryClient: { invalidateQueries: (f: { queryKey: readonly unknown[] }) => Promise<void> }, swapId: number) {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId) }),
    queryClient.invalidateQueries({ queryKey: [...swapKeys.all, 'block'] }),
  ]);
}
