import { useEffect, useRef } from 'react';
import type { ChatRoomDto } from '@shared/schemas/chat';
import { Button } from '@/components/ui/button';
import { Loading, QueryError } from '@/components/ui/page';
import { useMessages } from '../api/get-messages';
import { ChatMessageItem } from './chat-message-item';

/** Newest first; older pages load as the end of the list comes into view, or with the button. */
export function MessageList({ room }: { room: ChatRoomDto }) {
  const messages = useMessages(room.id);
  const sentinel = useRef<HTMLDivElement>(null);
  const { hasNextPage, isFetchingNextPage, fetchNextPage } = messages;

  useEffect(() => {
    const el = sentinel.current;
    if (!el || !hasNextPage) return;
    const observer = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting) && !isFetchingNextPage) void fetchNextPage();
      },
      { rootMargin: '200px' },
    );
    observer.observe(el);
    return () => observer.disconnect();
  }, [hasNextPage, isFetchingNextPage, fetchNextPage]);

  if (messages.isPending) return <Loading label="Loading messages…" />;
  if (messages.isError) return <QueryError error={messages.error} what="the messages" />;
  const all = messages.data.pages.flatMap((p) => p.messages);
  if (all.length === 0) return <p className="py-4 text-walnut-soft">No messages yet. Say hello!</p>;
  return (
    <div>
      <ol aria-label="Messages, newest first" className="space-y-3">
        {all.map((m) => (
          <ChatMessageItem key={m.id} message={m} mine={m.author.id === room.viewerId} canModerate={room.canModerate} />
        ))}
      </ol>
      <div ref={sentinel} className="pt-3 text-center">
        {hasNextPage ? (
          <Button
            variant="secondary"
            onClick={() => void fetchNextPage()}
            pending={isFetchingNextPage}
            pendingLabel="Loading older messages…"
          >
            Show older messages
          </Button>
        ) : (
          <p className="text-walnut-soft">That is the start of the conversation.</p>
        )}
      </div>
    </div>
  );
}
