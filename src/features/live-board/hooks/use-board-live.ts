import { useEffect } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { ActivityDto, PresenceChange, Viewer } from '@shared/live-events';
import { readAgainFromNow } from '@/lib/query-client';
import { getSocket } from '@/lib/socket';
import { useRosterLive } from '@/entities/roster/api/use-roster-live';
import { liveBoardKeys } from '../api/live-board-keys';
import { ACTIVITY_SHOWN } from '../api/get-activity';
import { prependActivities } from './prepend-activities';

/**
 * Keeps the board current: the roster through `useRosterLive` (shared with every roster view), plus
 * the board's own activity list and who is watching.
 */
export function useBoardLive(swapId: number) {
  const queryClient = useQueryClient();
  const viewers = useQuery<Viewer[]>({
    queryKey: liveBoardKeys.presence(swapId),
    queryFn: () => [],
    enabled: false,
    initialData: [],
    staleTime: Infinity,
  });

  const { joinError } = useRosterLive(swapId, {
    onJoined: (joined) => queryClient.setQueryData(liveBoardKeys.presence(swapId), joined.viewers),
    onPatched: (change) =>
      queryClient.setQueryData<ActivityDto[]>(liveBoardKeys.activity(swapId), (list) =>
        list ? prependActivities(list, change.activities, ACTIVITY_SHOWN) : list,
      ),
    onResync: () => readAgainFromNow(queryClient, liveBoardKeys.activity(swapId)),
  });

  useEffect(() => {
    const socket = getSocket();
    const onPresence = (p: PresenceChange) => {
      if (p.room.kind === 'board' && p.room.swapId === swapId)
        queryClient.setQueryData(liveBoardKeys.presence(swapId), p.viewers);
    };
    socket.on('presence:changed', onPresence);
    return () => {
      socket.off('presence:changed', onPresence);
    };
  }, [swapId, queryClient]);

  return { viewers: viewers.data, joinError };
}
