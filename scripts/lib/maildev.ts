/** maildev, the local mail fake, as a child process bound to loopback. */
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export interface MaildevHandle {
  smtpPort: number;
  webPort: number;
  apiUrl: string;
  stop(): Promise<void>;
}

// maildev exports only its ESM entry, so its CLI is found by path.
const maildevBin = () => fileURLToPath(new URL('../../node_modules/maildev/dist/bin/maildev.js', import.meta.url));

export async function startMaildev(opts: { smtpPort: number; webPort: number; mailDir?: string }): Promise<MaildevHandle> {
  const args = [
    maildevBin(),
    '--ip',
    '127.0.0.1',
    '--web-ip',
    '127.0.0.1',
    '-s',
    String(opts.smtpPort),
    '-w',
    String(opts.webPort),
    '--silent',
  ];
  if (opts.mailDir) args.push('--mail-directory', opts.mailDir);
  const child: ChildProcess = spawn(process.execPath, args, { stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr?.on('data', (chunk) => (stderr += String(chunk)));
  const apiUrl = `http://127.0.0.1:${opts.webPort}`;
  const deadline = Date.now() + 20_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`maildev exited early: ${stderr}`);
    try {
      const res = await fetch(`${apiUrl}/api/healthz`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  if (Date.now() >= deadline) throw new Error(`maildev did not answer on ${apiUrl}: ${stderr}`);
  return {
    smtpPort: opts.smtpPort,
    webPort: opts.webPort,
    apiUrl,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 3000).unref();
      }),
  };
}
