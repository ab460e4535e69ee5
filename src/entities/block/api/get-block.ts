import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from './swap-keys';

export const getBlock = (blockId: number) => api.get<BlockDto>(`/blocks/${blockId}`);
export const blockQueryOptions = (blockId: number) => queryOptions({ queryKey: swapKeys.block(blockId), queryFn: () => getBlock(blockId) });
export const useBlock = (blockId: number) => useQuery(blockQueryOptions(blockId));
