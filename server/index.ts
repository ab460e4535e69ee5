import { createServer, type Server } from 'node:http';
import { loadConfig, type Config } from './config';
import { createLogger } from './logger';
import { createSequelize } from './db/sequelize';
import { createPool } from './db/pool';
import { initModels } from './db/models';
import { migrateUp } from './db/migrator';
import { createMailer } from './mail/mailer';
import { createApp } from './app';
import { DomainEvents } from './events';
import type { AppDeps } from './deps';
import { featureStartups, type FeatureHandle } from './features';

export interface RunningServer {
  server: Server;
  deps: AppDeps;
  url: string;
  close(): Promise<void>;
}

/** Connects, migrates (under an advisory lock, so several nodes can start at once) and listens. */
export async function startServer(config: Config = loadConfig()): Promise<RunningServer> {
  const logger = createLogger(config);
  const sequelize = createSequelize(config.DATABASE_URL, logger);
  initModels(sequelize);
  await migrateUp(sequelize);
  const pool = createPool(config.DATABASE_URL, logger);
  const events = new DomainEvents();
  events.onListenerError(({ name, error }) => logger.error({ err: error, event: name }, 'event listener failed'));
  const deps: AppDeps = { config, logger, sequelize, pool, mailer: createMailer(config), events };
  const built = createApp(deps);
  const server = createServer(built.app);
  const features: FeatureHandle[] = [];
  for (const startup of featureStartups) features.push(await startup({ server, deps, built }));
  await new Promise<void>((resolve) => server.listen(config.PORT, config.HOST, resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  const url = `http://${config.HOST}:${port}`;
  logger.info({ url }, 'Blockpost is listening');

  let closing: Promise<void> | null = null;
  const close = () =>
    (closing ??= (async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
        setTimeout(() => server.closeAllConnections(), 5000).unref();
      });
      for (const feature of features.reverse()) {
        await feature
          .close()
          .catch((err: unknown) => logger.error({ err, feature: feature.name }, 'feature did not stop cleanly'));
      }
      deps.mailer.close();
      // A client the socket.io adapter lost in a database restart is never given back to the pool,
      // and pool.end() would wait for it forever.
      await Promise.race([pool.end(), new Promise((resolve) => setTimeout(resolve, 3000).unref())]);
      await sequelize.close();
    })());
  return { server, deps, url, close };
}

async function main() {
  const running = await startServer();
  const shutdown = (signal: string) => {
    running.deps.logger.info({ signal }, 'shutting down');
    running.close().then(
      () => process.exit(0),
      (err) => {
        running.deps.logger.error({ err }, 'shutdown failed');
        process.exit(1);
      },
    );
  };
  process.once('SIGINT', () => shutdown('SIGINT'));
  process.once('SIGTERM', () => shutdown('SIGTERM'));
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
}
