import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { blockKeys } from './block-keys';

export const getBlock = (blockId: number) => api.get<BlockDto>(`/blocks/${blockId}`);
export const blockQueryOptions = (blockId: number) =>
  queryOptions({ queryKey: blockKeys.detail(blockId), queryFn: () => getBlock(blockId) });
export const useBlock = (blockId: number) => useQuery(blockQueryOptions(blockId));
