import type { Sequelize } from 'sequelize';
import type pg from 'pg';
import type { Config } from './config';
import type { Logger } from './logger';
import type { Mailer } from './mail/mailer';
import type { DomainEvents } from './events';

/** What the app is built from; tests pass their own database and mailer. */
export interface AppDeps {
  config: Config;
  logger: Logger;
  sequelize: Sequelize;
  /** A plain pg pool for sessions, the socket.io adapter and the job queue. */
  pool: pg.Pool;
  mailer: Mailer;
  events: DomainEvents;
}
