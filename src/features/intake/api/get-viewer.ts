import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeDto } from '@shared/types';
import { api } from '@/lib/api-client';
import { intakeKeys } from './intake-keys';

/** Who is taking blocks in (their id tags queued actions) and the units they read lengths in. */
export const getViewer = () => api.get<MeDto>('/me');
export const viewerQueryOptions = () =>
  // 'offlineFirst': when the hall's network is gone the service worker's last copy still answers.
  queryOptions({ queryKey: intakeKeys.viewer(), queryFn: getViewer, staleTime: 5 * 60_000, networkMode: 'offlineFirst' });
export const useViewer = () => useQuery(viewerQueryOptions());
