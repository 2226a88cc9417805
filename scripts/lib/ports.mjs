// TCP port checks on loopback.
import net from 'node:net';
import { ScriptError } from './log.mjs';

/** Resolve true when something accepts connections on host:port. */
export function isListening(port, host = '127.0.0.1', timeoutMs = 500) {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    const done = (value) => {
      socket.destroy();
      resolve(value);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once('connect', () => done(true));
    socket.once('error', () => done(false));
  });
}

/** Resolve true when we could bind host:port right now. */
export function canBind(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen({ port, host, exclusive: true }, () => server.close(() => resolve(true)));
  });
}

/** A port the OS reports free on loopback (there is a small race until someone binds it). */
export function freePort(host = '127.0.0.1') {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen({ port: 0, host }, () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** Parse a port from an environment variable; a bad value stops with a clear line. */
export function portFromEnv(name, fallback, env = process.env) {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new ScriptError(`${name}=${raw} is not a TCP port; set it to a whole number between 1 and 65535`);
  }
  return port;
}
