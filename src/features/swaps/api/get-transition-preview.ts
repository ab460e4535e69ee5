import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapState } from '@shared/schemas/swaps';
import type { TransitionPreviewDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

/** Under the swap's transitions, so a move made refreshes every preview of it. */
export const transitionPreviewKey = (swapId: number, to: SwapState) => [...swapKeys.transitions(swapId), 'preview', to] as const;

export const getTransitionPreview = (swapId: number, to: SwapState) =>
  api.get<TransitionPreviewDto>(`/swaps/${swapId}/transitions/preview?to=${encodeURIComponent(to)}`);

export const transitionPreviewQueryOptions = (swapId: number, to: SwapState) =>
  queryOptions({ queryKey: transitionPreviewKey(swapId, to), queryFn: () => getTransitionPreview(swapId, to), staleTime: 0 });

/** What moving to `to` would do; nothing is asked while `to` is null. */
export const useTransitionPreview = (swapId: number, to: SwapState | null) =>
  useQuery({ ...transitionPreviewQueryOptions(swapId, to ?? 'draft'), enabled: to !== null });
