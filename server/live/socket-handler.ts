import type { ZodType } from 'zod';
import { zodFields } from '@shared/schemas/errors';
import type { Ack, AckCallback, LiveError } from '@shared/live-events';
import { AppError } from '../http/errors';
import type { Logger } from '../logger';
import type { LiveSocket } from './live-types';

/** The socket counterpart of the HTTP error middleware: an AppError becomes `{ error }`, anything else is logged. */
function toLiveError(error: unknown, logger: Logger, context: Record<string, unknown>): LiveError {
  if (error instanceof AppError) {
    return { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) };
  }
  logger.error({ err: error, ...context }, 'socket event failed');
  return { code: 'internal', message: 'Something went wrong on our side. Nothing you entered was lost; please try again.' };
}

/**
 * Registers a client event whose payload is parsed with `schema` first (a bad payload gets a
 * validation error, the handler never sees it) and whose result or error answers the acknowledgement.
 */
export function handle<S extends ZodType, T>(
  socket: LiveSocket,
  logger: Logger,
  event: string,
  schema: S,
  run: (input: S['_output']) => Promise<T>,
) {
  (socket as unknown as { on(e: string, l: (...args: unknown[]) => void): void }).on(event, (...args: unknown[]) => {
    const maybeAck = args[args.length - 1];
    const ack = typeof maybeAck === 'function' ? (maybeAck as AckCallback<T>) : undefined;
    const payload = ack && args.length === 1 ? undefined : args[0];
    const reply = (answer: Ack<T>) => ack?.(answer);
    const parsed = schema.safeParse(payload);
    if (!parsed.success) {
      const fields = zodFields(parsed.error);
      logger.warn({ userId: socket.data.user?.userId, event, fields }, 'socket payload refused');
      reply({ error: { code: 'validation', message: Object.values(fields)[0] ?? 'That request is not valid.', fields } });
      return;
    }
    run(parsed.data).then(
      (data) => reply({ data }),
      (error: unknown) => reply({ error: toLiveError(error, logger, { event, userId: socket.data.user?.userId }) }),
    );
  });
}
