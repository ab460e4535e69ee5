import { liveStartup } from './live.startup';

/** The socket.io server with every live part: swap boards, sew-day and swap chat. */
export const liveFeature = liveStartup([]);
