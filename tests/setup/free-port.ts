import { createServer } from 'node:net';

/**
 * Ports for test servers come from 20000–32767, below Linux's ephemeral range (32768–60999 by
 * default, /proc/sys/net/ipv4/ip_local_port_range). A port the OS handed out from the ephemeral
 * range and released again can be taken at once by an outgoing connection of another test (CI saw
 * "Port 38535 is already in use" that way); ports below the range are never given to outgoing
 * connections, so only another listener can take one, and `startWithFreePorts` retries then.
 */
const LOW = 20000;
const HIGH = 32767;

function canListen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = createServer();
    srv.unref();
    srv.once('error', () => resolve(false));
    srv.listen(port, '127.0.0.1', () => srv.close(() => resolve(true)));
  });
}

/** A TCP port free on 127.0.0.1 right now, outside the ephemeral range (released before returning). */
export async function freePort(): Promise<number> {
  for (let attempt = 0; attempt < 200; attempt++) {
    const port = LOW + Math.floor(Math.random() * (HIGH - LOW + 1));
    if (await canListen(port)) return port;
  }
  throw new Error(`no free port found in ${LOW}–${HIGH}`);
}

/** True when a child server's output says it could not bind its port (server/index.ts prints this). */
export function lostPortRace(output: string): boolean {
  return /is already in use|EADDRINUSE/.test(output);
}

/**
 * Runs `start` with fresh ports until it does not fail for a port taken between choosing and
 * binding (another test's listener can still win that race); any other failure is thrown as is.
 */
export async function startWithFreePorts<T>(start: (port: number, smtpPort: number) => Promise<T>, attempts = 5): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    const port = await freePort();
    const smtpPort = await freePort();
    try {
      return await start(port, smtpPort);
    } catch (err) {
      if (attempt >= attempts || !lostPortRace(String(err))) throw err;
      console.warn(`[free-port] port ${port} or ${smtpPort} was taken before the server bound it; choosing again`);
    }
  }
}
