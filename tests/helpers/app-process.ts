import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

/**
 * The app as a real child process (`server/index.ts`, as `npm start` runs it, without the
 * client build), for tests of what happens around it: its database stopping, a kill -9.
 * Node runs it with tsx's loader in one process, so the process id is the app's own and a
 * SIGKILL leaves nothing behind.
 */

const root = path.resolve(import.meta.dirname, '../..');

export interface AppProcess {
  baseUrl: string;
  child: ChildProcess;
  /** Everything it printed, for a failing test's message. */
  output: () => string;
  /** Stops it: SIGKILL for a crash, SIGTERM for a clean stop. Resolves once it has exited. */
  kill: (signal: NodeJS.Signals) => Promise<void>;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/**
 * Starts the app on `port` against `databaseUrl` (no demo seed) and waits until its health
 * check answers.
 * @param dataDir - its data folder (session secret); a temporary one
 */
export async function startAppProcess(options: { databaseUrl: string; port: number; dataDir: string }): Promise<AppProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'server/index.ts')], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      TSX_TSCONFIG_PATH: path.join(root, 'tsconfig.server.json'),
      HOST: '127.0.0.1',
      PORT: String(options.port),
      DATABASE_URL: options.databaseUrl,
      DATA_DIR: options.dataDir,
      SEED_DEMO: 'false',
      SESSION_SECRET: 'faults-test-session-secret-0123456789abcdef',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let printed = '';
  child.stdout?.on('data', (chunk: Buffer) => (printed += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (printed += chunk.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const baseUrl = `http://127.0.0.1:${options.port}`;
  const app: AppProcess = {
    baseUrl,
    child,
    output: () => printed,
    kill: async (signal) => {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await exited;
    },
  };
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The app exited at start:\n${printed}`);
    const health = await fetch(`${baseUrl}/api/health`).catch(() => null);
    if (health?.status === 200) return app;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  await app.kill('SIGKILL');
  throw new Error(`The app did not answer within 30 s:\n${printed}`);
}

/** Signs in over HTTP and answers the session cookie to send with later requests. */
export async function signInCookie(baseUrl: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}
