import type pg from 'pg';
import { createAdapter } from '@socket.io/postgres-adapter';

/**
 * The largest message the adapter sends inline in a NOTIFY. PostgreSQL refuses a payload of 8,000
 * bytes or more ("payload string too long"; the limit is BLCKSZ − NAMEDATALEN − 128 in a default
 * build), but the adapter's own threshold sends one of exactly 8,000 inline, and that message never
 * reached the other nodes. Anything larger goes through socket_io_attachments. (A known bug upstream,
 * socketio/socket.io-postgres-adapter#17; 0.5.0, the latest release, still sends it inline.)
 */
export const NOTIFY_PAYLOAD_MAX_BYTES = 7_999;

/** The app's socket.io adapter: rooms and server-side messages shared across nodes through PostgreSQL. */
export function liveAdapter(pool: pg.Pool, onError: (err: Error) => void) {
  return createAdapter(pool, { payloadThreshold: NOTIFY_PAYLOAD_MAX_BYTES, errorHandler: onError });
}
