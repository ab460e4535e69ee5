import { useEffect, useRef, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { BoardChange, BoardJoined, PresenceChange, Viewer } from '@shared/live-events';
import type { RosterDto } from '@shared/swap-types';
import type { ActivityDto } from '@shared/live-events';
import { ApiError } from '@/lib/api-client';
import { emitWithAck, getSocket } from '@/lib/socket';
import { liveBoardKeys } from '../api/live-board-keys';
import { ACTIVITY_SHOWN } from '../api/get-activity';
import { applyBoardPatch, prependActivities } from './apply-board-patch';

/**
 * Keeps the board's cached roster and activity current. Each change carries the swap's next number:
 * the next one in line is patched in with setQueryData; an older one is ignored; a gap (or a
 * reconnect) means something was missed, so the roster and activity are fetched again.
 */
export function useBoardLive(swapId: number) {
  const queryClient = useQueryClient();
  const version = useRef<number | null>(null);
  const [joinError, setJoinError] = useState('');
  const viewers = useQuery<Viewer[]>({ queryKey: liveBoardKeys.presence(swapId), queryFn: () => [], enabled: false, initialData: [], staleTime: Infinity });

  useEffect(() => {
    const socket = getSocket();
    const refetch = () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: liveBoardKeys.roster(swapId) }),
        queryClient.invalidateQueries({ queryKey: liveBoardKeys.activity(swapId) }),
      ]);
    const join = () => {
      emitWithAck<BoardJoined>('board:join', { swapId })
        .then((joined) => {
          setJoinError('');
          const missed = version.current !== null && joined.version !== version.current;
          const first = version.current === null;
          version.current = joined.version;
          queryClient.setQueryData(liveBoardKeys.presence(swapId), joined.viewers);
          // The first load may have raced a change made while joining; a rejoin may have missed some.
          if (missed || first) void refetch();
        })
        .catch((e: unknown) => setJoinError(e instanceof ApiError ? e.message : 'The live board could not connect.'));
    };
    const onChange = (change: BoardChange) => {
      if (change.swapId !== swapId || version.current === null || change.version <= version.current) return;
      const inLine = change.version === version.current + 1;
      version.current = change.version;
      const cached = queryClient.getQueryData<RosterDto>(liveBoardKeys.roster(swapId));
      if (!inLine || !change.patch || !cached) {
        void refetch();
        return;
      }
      queryClient.setQueryData<RosterDto>(liveBoardKeys.roster(swapId), applyBoardPatch(cached, change.patch));
      queryClient.setQueryData<ActivityDto[]>(liveBoardKeys.activity(swapId), (list) => (list ? prependActivities(list, change.activities, ACTIVITY_SHOWN) : list));
    };
    const onPresence = (p: PresenceChange) => {
      if (p.room.kind === 'board' && p.room.swapId === swapId) queryClient.setQueryData(liveBoardKeys.presence(swapId), p.viewers);
    };
    socket.on('connect', join);
    socket.on('board:changed', onChange);
    socket.on('presence:changed', onPresence);
    if (socket.connected) join();
    return () => {
      socket.off('connect', join);
      socket.off('board:changed', onChange);
      socket.off('presence:changed', onPresence);
      if (socket.connected) socket.emit('board:leave', { swapId });
      version.current = null;
    };
  }, [swapId, queryClient]);

  return { viewers: viewers.data, joinError };
}
