/**
 * A TCP port on 127.0.0.1 that was free a moment ago (the OS picks it), for a server started in
 * another process. Loopback only.
 */
import { createServer } from 'node:net';

/** Asks the OS for a free loopback port and releases it. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address !== null ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}
