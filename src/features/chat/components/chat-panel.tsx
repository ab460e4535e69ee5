import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Card } from '@/components/ui/card';
import { markRoomSeen } from '@/entities/me/api/mark-room-seen';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { useLiveStatus } from '@/lib/socket';
import { useChatRoom } from '../api/get-chat-room';
import { useChatLive } from '../hooks/use-chat-live';
import { MessageComposer } from './message-composer';
import { MessageList } from './message-list';

const statusWords = {
  connected: 'Live: new messages appear by themselves.',
  connecting: 'Connecting…',
  offline: 'Offline: reconnecting. Messages you send go when the connection is back.',
  'signed-out': 'Sign in again to see new messages as they come.',
} as const;

function names(list: string[]) {
  return list.length <= 2 ? list.join(' and ') : `${list.slice(0, -1).join(', ')} and ${list.at(-1)}`;
}

/** A room's conversation: who is here, who is typing, the composer and the history. */
export function ChatPanel({ roomId, title = 'Chat' }: { roomId: number; title?: string }) {
  const room = useChatRoom(roomId);
  const live = useChatLive(roomId, room.data?.viewerId);
  const status = useLiveStatus();
  const queryClient = useQueryClient();
  // Opening the room and leaving it both count as having read it, for the home screen's unread counts.
  useEffect(() => {
    void markRoomSeen(queryClient, roomId);
    return () => void markRoomSeen(queryClient, roomId);
  }, [queryClient, roomId]);
  if (room.isPending) return <Loading label="Opening the chat…" />;
  if (room.isError) return <QueryError error={room.error} what="the chat" />;
  const others = live.viewers.filter((v) => v.userId !== room.data.viewerId).map((v) => v.displayName);

  return (
    <Card title={title}>
      <p className="text-base text-walnut-soft">
        <span
          aria-hidden="true"
          className={`mr-1 inline-block h-3 w-3 rounded-full ${status === 'connected' ? 'bg-lichen' : 'bg-weld'}`}
        />
        {statusWords[status]}
      </p>
      <p className="mt-1">{others.length ? `Here now: ${names(others)}.` : 'Nobody else is here right now.'}</p>
      {live.joinError && (
        <div className="mt-3">
          <Alert tone="error">{live.joinError}</Alert>
        </div>
      )}
      <div className="mt-4">
        {room.data.canPost ? (
          <MessageComposer roomId={roomId} onTyping={live.notifyTyping} />
        ) : (
          <p>Your role here lets you read the chat.</p>
        )}
        <p aria-live="polite" className="mt-1 min-h-7 text-base italic text-walnut-soft">
          {live.typingNames.length > 0 && `${names(live.typingNames)} ${live.typingNames.length === 1 ? 'is' : 'are'} typing…`}
        </p>
      </div>
      <div className="mt-2">
        <MessageList room={room.data} />
      </div>
    </Card>
  );
}
