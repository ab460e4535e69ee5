import { chatLive } from '../chat/chat.socket';
import { liveStartup } from './live.startup';
import { boardLive } from './board.socket';

/** The socket.io server with every live part: swap boards, sew-day and swap chat. */
export const liveFeature = liveStartup([boardLive(), chatLive]);
