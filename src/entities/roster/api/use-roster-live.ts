import { useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { BoardChange, BoardJoined, BoardPatch } from '@shared/live-events';
import type { RosterDto } from '@shared/swap-types';
import { ApiError } from '@/lib/api-client';
import { readAgainFromNow } from '@/lib/query-client';
import { emitWithAck, getSocket } from '@/lib/socket';
import { applyBoardPatch, boardChangeStep } from './apply-board-patch';
import { markStaleAfterChange } from './mark-stale-after-change';
import { rosterKeys } from './roster-keys';

export interface RosterLiveHandlers {
  /** The board room was joined (again): its viewers. */
  onJoined?: (joined: BoardJoined) => void;
  /** A change came in line and was patched into the roster. */
  onPatched?: (change: BoardChange) => void;
  /** Something was missed and the roster is fetched again: refetch whatever else follows the board. */
  onResync?: () => unknown;
}

// Views of one swap that follow its board in this tab; the room is left when the last one closes.
const following = new Map<number, number>();

/**
 * Keeps every cached view of a swap's roster current from the board's live changes. Each change
 * carries the swap's next number: the next one in line is patched in with setQueryData (and the
 * swap and blocks it touched marked stale, so their open views refetch); an older one is ignored; a
 * gap (or a reconnect) means something was missed, so the roster is fetched again.
 */
export function useRosterLive(swapId: number, handlers: RosterLiveHandlers = {}) {
  const queryClient = useQueryClient();
  const version = useRef<number | null>(null);
  const latest = useRef(handlers);
  const [joinError, setJoinError] = useState('');

  useEffect(() => {
    latest.current = handlers;
  });

  useEffect(() => {
    const socket = getSocket();
    following.set(swapId, (following.get(swapId) ?? 0) + 1);
    // While the roster is read again, the changes that come in line are kept here and put in after
    // the read (roster and `onPatched` alike): its answer replaces the cache, and may have been read
    // before they were made.
    let changesDuringRead: Array<BoardChange & { patch: BoardPatch }> | null = null;
    const refetch = async () => {
      const queryKey = rosterKeys.detail(swapId);
      const changes: Array<BoardChange & { patch: BoardPatch }> = [];
      changesDuringRead = changes;
      try {
        await Promise.all([readAgainFromNow(queryClient, queryKey), latest.current.onResync?.()]);
      } finally {
        if (changesDuringRead === changes) changesDuringRead = null;
        for (const change of changes) {
          const read = queryClient.getQueryData<RosterDto>(queryKey);
          if (read) queryClient.setQueryData<RosterDto>(queryKey, applyBoardPatch(read, change.patch));
          latest.current.onPatched?.(change);
        }
      }
    };
    const join = () => {
      emitWithAck<BoardJoined>('board:join', { swapId })
        .then((joined) => {
          setJoinError('');
          const missed = version.current !== null && joined.version !== version.current;
          const first = version.current === null;
          version.current = joined.version;
          latest.current.onJoined?.(joined);
          // The first load may have raced a change made while joining; a rejoin may have missed some.
          if (missed || first) void refetch();
        })
        .catch((e: unknown) => setJoinError(e instanceof ApiError ? e.message : 'The live board could not connect.'));
    };
    const onChange = (change: BoardChange) => {
      if (change.swapId !== swapId) return;
      const queryKey = rosterKeys.detail(swapId);
      const cached = queryClient.getQueryData<RosterDto>(queryKey);
      const inLine = version.current !== null && change.version === version.current + 1 && change.patch !== null;
      const step = changesDuringRead && inLine ? 'patch' : boardChangeStep(version.current, change, cached !== undefined);
      if (step === 'ignore') return;
      version.current = change.version;
      void markStaleAfterChange(queryClient, swapId, step === 'patch' ? change.patch : null);
      if (step === 'refetch' || !change.patch) {
        void refetch();
        return;
      }
      changesDuringRead?.push({ ...change, patch: change.patch });
      if (cached) queryClient.setQueryData<RosterDto>(queryKey, applyBoardPatch(cached, change.patch));
      latest.current.onPatched?.(change);
    };
    socket.on('connect', join);
    socket.on('board:changed', onChange);
    if (socket.connected) join();
    return () => {
      socket.off('connect', join);
      socket.off('board:changed', onChange);
      const left = (following.get(swapId) ?? 1) - 1;
      if (left > 0) following.set(swapId, left);
      else {
        following.delete(swapId);
        if (socket.connected) socket.emit('board:leave', { swapId });
      }
      version.current = null;
    };
  }, [swapId, queryClient]);

  return { joinError };
}
