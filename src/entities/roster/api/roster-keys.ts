import { swapKeys } from '@/entities/swap/api/swap-keys';

/** Query key of a swap's roster: under the swap's detail, so whatever refreshes the swap refreshes its roster. */
export const rosterKeys = {
  detail: (swapId: number) => [...swapKeys.detail(swapId), 'roster'] as const,
};
