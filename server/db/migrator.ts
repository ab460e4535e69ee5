import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname } from 'node:path';
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize };
export type Migration = (params: { context: MigrationContext }) => Promise<void>;

const here = dirname(fileURLToPath(import.meta.url));
// Any constant works; it only has to be the same for every node.
const MIGRATION_LOCK = 7_314_002;

/** Migrations are TypeScript files named NNNN-name.ts, applied in name order. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['migrations/*.ts', { cwd: here, ignore: ['**/*.d.ts'] }],
      // import() rather than umzug's default require, so tsx and vitest both load TypeScript.
      resolve: ({ name, path, context }) => ({
        name,
        up: async () => (await import(pathToFileURL(path!).href)).up({ context }),
        down: async () => (await import(pathToFileURL(path!).href)).down?.({ context }),
      }),
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/** Applies pending migrations under a session advisory lock, so two nodes starting together do not race. */
export async function migrateUp(sequelize: Sequelize) {
  // A session lock needs one connection held throughout, not whichever the pool hands out.
  const connection = (await sequelize.connectionManager.getConnection({ type: 'write' })) as unknown as {
    query(sql: string, values: unknown[]): Promise<unknown>;
  };
  await connection.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK]);
  try {
    return await createMigrator(sequelize).up();
  } finally {
    await connection.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK]);
    sequelize.connectionManager.releaseConnection(connection as never);
  }
}
