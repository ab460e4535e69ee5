// @vitest-environment happy-dom
/**
 * A chat room's history when its live room is joined: messages only come live once the room is
 * joined, so whatever history was read before (on an earlier visit, or a first load still under way)
 * is read again, and a message that arrives while it is read is not lost to the read's answer.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, waitFor } from '@testing-library/react';
import { type QueryClient, useInfiniteQuery } from '@tanstack/react-query';
import type { ChatMessageDto, ChatPageDto } from '../../shared/schemas/chat';

vi.mock('../../src/lib/socket', () => import('../helpers/fake-live-socket'));
const { live, newQueryClient, renderWithClient } = await import('../helpers/fake-live-socket');
const { useChatLive } = await import('../../src/features/chat/hooks/use-chat-live');
const { chatKeys } = await import('../../src/features/chat/api/chat-keys');

afterEach(cleanup);

const ROOM = 4;
const message = (id: number, body: string): ChatMessageDto => ({
  id,
  roomId: ROOM,
  author: { id: 2, displayName: 'Wren Okafor' } as ChatMessageDto['author'],
  body,
  photos: [],
  createdAt: '2026-11-14T10:00:00.000Z',
  editedAt: null,
  removed: null,
});

/** A history endpoint whose answers are released one at a time, each with the messages the server had. */
function slowHistory() {
  const pending: Array<(messages: ChatMessageDto[]) => void> = [];
  const fetchPage = () =>
    new Promise<ChatPageDto>((resolve) => pending.push((messages) => resolve({ messages, nextCursor: null })));
  return { fetchPage, pending };
}

function Room({ fetchPage }: { fetchPage: () => Promise<ChatPageDto> }) {
  const history = useInfiniteQuery({
    queryKey: chatKeys.messages(ROOM),
    queryFn: fetchPage,
    initialPageParam: undefined as number | undefined,
    getNextPageParam: () => undefined,
    staleTime: Infinity,
  });
  useChatLive(ROOM, 1);
  if (!history.data) return <p>loading</p>;
  return <p>{history.data.pages.flatMap((p) => p.messages.map((m) => m.body)).join(' / ') || 'empty'}</p>;
}

function renderRoom(client: QueryClient, fetchPage: () => Promise<ChatPageDto>) {
  return renderWithClient(<Room fetchPage={fetchPage} />, client);
}

describe('joining a chat room', () => {
  it('reads the history after the join when the first load was still under way', async () => {
    const api = slowHistory();
    const { container } = renderRoom(newQueryClient(), api.fetchPage);
    await waitFor(() => expect(api.pending).toHaveLength(1));
    live.answer({ viewers: [] }); // joined before the first load answered
    await waitFor(() => expect(api.pending).toHaveLength(2));
    api.pending[0]!([]); // the first read, taken before "Pins ready?" was sent
    api.pending[1]!([message(1, 'Pins ready?')]);
    await waitFor(() => expect(container.textContent).toBe('Pins ready?'));
  });

  it('reads again a history cached on an earlier visit', async () => {
    const client = newQueryClient();
    const api = slowHistory();
    const first = renderRoom(client, api.fetchPage);
    live.answer({ viewers: [] });
    await waitFor(() => expect(api.pending).toHaveLength(2));
    api.pending[1]!([message(1, 'Pins ready?')]);
    await waitFor(() => expect(first.container.textContent).toBe('Pins ready?'));
    first.unmount(); // off to another page while the room goes on

    const again = renderRoom(client, api.fetchPage);
    expect(again.container.textContent).toBe('Pins ready?'); // the cached history shows at once
    live.answer({ viewers: [] });
    await waitFor(() => expect(api.pending).toHaveLength(3));
    api.pending[2]!([message(2, 'Iron is hot, mind the cord'), message(1, 'Pins ready?')]);
    await waitFor(() => expect(again.container.textContent).toBe('Iron is hot, mind the cord / Pins ready?'));
  });

  it('keeps a message that arrives live while the history is read again', async () => {
    const api = slowHistory();
    const { container } = renderRoom(newQueryClient(), api.fetchPage);
    live.answer({ viewers: [] });
    await waitFor(() => expect(api.pending).toHaveLength(2));
    live.handlers.get('message:created')!(message(3, 'Starting the strip sets'));
    api.pending[1]!([message(1, 'Pins ready?')]); // read just before message 3 was sent
    await waitFor(() => expect(container.textContent).toBe('Starting the strip sets / Pins ready?'));
  });
});
