import { Link, useParams } from 'react-router';
import { Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useSwapChatRoom } from '../api/get-swap-chat-room';
import { ChatPanel } from './chat-panel';

/** The swap's own conversation. */
export function SwapChatPage() {
  const params = useParams();
  const guildId = Number(params.guildId);
  const swapId = Number(params.swapId);
  const room = useSwapChatRoom(swapId);
  if (room.isPending) return <Loading label="Opening the swap chat…" />;
  if (room.isError) return <QueryError error={room.error} what="the swap chat" />;
  return (
    <div className="space-y-4">
      <p>
        <Link className="font-semibold text-indigo underline" to={paths.swapBoard(guildId, swapId)}>
          ← Live board of this swap
        </Link>
      </p>
      <ChatPanel roomId={room.data.id} title={`Chat: ${room.data.title}`} />
    </div>
  );
}
