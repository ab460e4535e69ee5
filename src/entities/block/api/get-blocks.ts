import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { blockKeys } from './block-keys';

/** `mine`: the caller's blocks; `incoming`: blocks returned to the caller; `all`: every block (officers). */
export type BlockFilter = 'mine' | 'incoming' | 'all';
const query = { mine: { maker: 'me' }, incoming: { recipient: 'me' }, all: {} } as const;

export const getBlocks = (swapId: number, filter: BlockFilter) =>
  api.get<BlockDto[]>(`/swaps/${swapId}/blocks`, { query: query[filter] });
export const blocksQueryOptions = (swapId: number, filter: BlockFilter) =>
  queryOptions({ queryKey: blockKeys.list(swapId, filter), queryFn: () => getBlocks(swapId, filter) });
export const useBlocks = (swapId: number, filter: BlockFilter, enabled = true) =>
  useQuery({ ...blocksQueryOptions(swapId, filter), enabled });
