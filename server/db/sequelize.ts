import { Sequelize } from 'sequelize';
import type { Logger } from '../logger';
import { IDLE_CONNECTION_MS, NAMED_STATEMENTS_PLANNED_ONCE } from './pool';

/** One Sequelize instance per process; numeric columns come back as strings, so models convert them. */
export function createSequelize(databaseUrl: string, logger?: Logger, poolMax = 10): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: logger ? (sql) => logger.trace({ sql }, 'sql') : false,
    pool: { max: poolMax, min: 0, idle: IDLE_CONNECTION_MS, acquire: 10_000 },
    define: { underscored: true, timestamps: true },
    dialectOptions: { application_name: 'blockpost', options: NAMED_STATEMENTS_PLANNED_ONCE },
  });
}
