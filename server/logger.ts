import { pino, type Logger } from 'pino';
import type { Config } from './config';

export type { Logger };

/** The app's logger: JSON lines to standard output (or to `destination`, as the tests read them). */
export function createLogger(config: Pick<Config, 'LOG_LEVEL' | 'NODE_ENV'>, destination?: pino.DestinationStream): Logger {
  const options = {
    level: config.LOG_LEVEL,
    base: { app: 'blockpost' },
    redact: { paths: ['req.headers.cookie', 'req.headers.authorization', 'password', '*.password'], remove: true },
  };
  return destination ? pino(options, destination) : pino(options);
}
