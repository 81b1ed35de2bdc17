import net from 'node:net';
import { StartupError } from '../db/local-postgres';

/**
 * Refuses to go on when the app's own port is taken, before anything else starts, with one
 * line naming the port and the setting to change (instead of a listen error's stack trace).
 */
export function requireFreePort(host: string, port: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EADDRINUSE' || err.code === 'EACCES') {
        reject(
          new StartupError(
            `Port ${port} on ${host} is ${err.code === 'EACCES' ? 'not allowed for this user' : 'already in use (is Cellarwright already running?)'}. Set PORT to a free port (for example PORT=${port + 1} npm start).`,
          ),
        );
      } else {
        reject(err);
      }
    });
    probe.listen(port, host, () => probe.close(() => resolve()));
  });
}
