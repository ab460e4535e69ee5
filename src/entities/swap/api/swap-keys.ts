/**
 * Query keys of swaps: all → lists → list(guild) and all → details → detail(swap) → transitions. A swap's
 * roster (`rosterKeys`) and block lists (`blockKeys`) sit under its detail, so invalidating the detail
 * refreshes them too.
 */
export const swapKeys = {
  all: ['swaps'] as const,
  lists: () => [...swapKeys.all, 'list'] as const,
  list: (guildId: number) => [...swapKeys.lists(), guildId] as const,
  details: () => [...swapKeys.all, 'detail'] as const,
  detail: (swapId: number) => [...swapKeys.details(), swapId] as const,
  transitions: (swapId: number) => [...swapKeys.detail(swapId), 'transitions'] as const,
};
