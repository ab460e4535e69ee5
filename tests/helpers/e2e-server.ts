/** The whole app (API, sockets, built client) on a free loopback port, on a fresh database. */
import { existsSync } from 'node:fs';
import { startServer, type RunningServer } from '../../server/index';
import { clientDist } from '../../server/app';
import { freePort } from '../../scripts/lib/ports';
import { createTestDatabase, testConfig } from './test-app';

export async function startE2eServer(overrides: Partial<Record<string, string>> = {}): Promise<RunningServer> {
  // CLIENT_DIR (optional) points at a build of one's own, so two developers' runs never share dist/.
  const clientDir = process.env.CLIENT_DIR ?? clientDist;
  if (!existsSync(`${clientDir}/index.html`)) throw new Error('Build the client first: npx vite build (npm test does it).');
  const port = await freePort();
  return startServer(
    testConfig(await createTestDatabase(), {
      PORT: String(port),
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      SERVE_CLIENT: 'true',
      CLIENT_DIR: clientDir,
      ...overrides,
    }),
  );
}
