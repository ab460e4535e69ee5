import { useCallback, useEffect, useRef, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { ChatJoined, Viewer } from '@shared/live-events';
import type { ChatMessageDto } from '@shared/schemas/chat';
import { readAgainFromNow } from '@/lib/query-client';
import { emitWithAck, getSocket } from '@/lib/socket';
import { ApiError } from '@/lib/api-client';
import { chatKeys } from '../api/chat-keys';
import { upsertMessage } from '../api/message-cache';

const TYPING_SHOWN_MS = 4000;
const TYPING_SENT_EVERY_MS = 2500;

/**
 * Keeps a room's history current: joins the room on every (re)connect, puts live messages into the
 * cached history, refetches what may have been missed while away, and tracks who is here and typing.
 */
export function useChatLive(roomId: number, viewerId: number | undefined) {
  const queryClient = useQueryClient();
  const [joinError, setJoinError] = useState('');
  const [typing, setTyping] = useState<Record<number, { name: string; at: number }>>({});
  const lastSent = useRef(0);
  const viewers = useQuery<Viewer[]>({
    queryKey: chatKeys.presence(roomId),
    queryFn: () => [],
    staleTime: Infinity,
    enabled: false,
    initialData: [],
  });

  useEffect(() => {
    const socket = getSocket();
    let arrivedDuringRead: ChatMessageDto[] | null = null;
    const join = () => {
      emitWithAck<ChatJoined>('chat:join', { roomId })
        .then(async (joined) => {
          setJoinError('');
          queryClient.setQueryData(chatKeys.presence(roomId), joined.viewers);
          // Live messages only come once the room is joined, so whatever history is cached (from an
          // earlier visit, before a reconnect, or a first load still under way) may lack some: read it
          // again. Messages arriving meanwhile are put in again after the read, whose answer replaces
          // the cache.
          const arrived: ChatMessageDto[] = [];
          arrivedDuringRead = arrived;
          try {
            await readAgainFromNow(queryClient, chatKeys.messages(roomId));
          } finally {
            if (arrivedDuringRead === arrived) arrivedDuringRead = null;
            for (const message of arrived) upsertMessage(queryClient, message);
          }
        })
        .catch((e: unknown) => setJoinError(e instanceof ApiError ? e.message : 'The live connection could not open this room.'));
    };
    const onMessage = (message: Parameters<typeof upsertMessage>[1]) => {
      if (message.roomId !== roomId) return;
      upsertMessage(queryClient, message);
      arrivedDuringRead?.push(message);
      setTyping((t) => {
        if (!t[message.author.id]) return t;
        const { [message.author.id]: _gone, ...rest } = t;
        return rest;
      });
    };
    const onPresence = (p: { room: { kind: string; roomId?: number }; viewers: Viewer[] }) => {
      if (p.room.kind === 'chat' && p.room.roomId === roomId) queryClient.setQueryData(chatKeys.presence(roomId), p.viewers);
    };
    const onTyping = ({ roomId: id, user }: { roomId: number; user: Viewer }) => {
      if (id === roomId && user.userId !== viewerId)
        setTyping((t) => ({ ...t, [user.userId]: { name: user.displayName, at: Date.now() } }));
    };
    socket.on('connect', join);
    socket.on('message:created', onMessage);
    socket.on('message:updated', onMessage);
    socket.on('presence:changed', onPresence);
    socket.on('typing:started', onTyping);
    if (socket.connected) join();
    return () => {
      socket.off('connect', join);
      socket.off('message:created', onMessage);
      socket.off('message:updated', onMessage);
      socket.off('presence:changed', onPresence);
      socket.off('typing:started', onTyping);
      if (socket.connected) socket.emit('chat:leave', { roomId });
    };
  }, [roomId, viewerId, queryClient]);

  // Typing notes fade after a few seconds without news.
  useEffect(() => {
    if (Object.keys(typing).length === 0) return;
    const timer = setInterval(() => {
      setTyping((t) => {
        const fresh = Object.entries(t).filter(([, v]) => Date.now() - v.at < TYPING_SHOWN_MS);
        return fresh.length === Object.keys(t).length ? t : Object.fromEntries(fresh);
      });
    }, 1000);
    return () => clearInterval(timer);
  }, [typing]);

  const notifyTyping = useCallback(() => {
    const now = Date.now();
    if (now - lastSent.current < TYPING_SENT_EVERY_MS) return;
    lastSent.current = now;
    const socket = getSocket();
    if (socket.connected) socket.emit('typing:start', { roomId });
  }, [roomId]);

  return { viewers: viewers.data, typingNames: Object.values(typing).map((t) => t.name), notifyTyping, joinError };
}
