/** Query keys of payments: all → a swap's fees / a guild's dues / the caller's payments / the treasurer's list. */
export const paymentKeys = {
  all: ['payments'] as const,
  swapFees: (swapId: number) => [...paymentKeys.all, 'swap-fees', swapId] as const,
  dues: (guildId: number) => [...paymentKeys.all, 'dues', guildId] as const,
  mine: (session?: string) => [...paymentKeys.all, 'mine', session ?? 'all'] as const,
  guild: (guildId: number, filters: Record<string, string | number | undefined> = {}) =>
    [...paymentKeys.all, 'guild', guildId, filters] as const,
};
