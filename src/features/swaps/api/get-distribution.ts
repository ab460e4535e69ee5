import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DistributionByRecipientDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

/** Under the swap's detail, so confirming the return (which refreshes the detail) refreshes this too. */
export const distributionKey = (swapId: number) => [...swapKeys.detail(swapId), 'distribution', 'by-recipient'] as const;

export const getDistributionByRecipient = (swapId: number) =>
  api.get<DistributionByRecipientDto[]>(`/swaps/${swapId}/distribution?by=recipient`);

export const distributionQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: distributionKey(swapId), queryFn: () => getDistributionByRecipient(swapId) });

/** Each recipient's bundle of the confirmed return, for hand-out night. */
export const useDistributionByRecipient = (swapId: number, enabled = true) =>
  useQuery({ ...distributionQueryOptions(swapId), enabled });
