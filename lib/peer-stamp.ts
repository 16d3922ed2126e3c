import { randomBytes } from 'node:crypto';
import * as Http from 'node:http';

// The socket's address, handed to route handlers and server actions. Next.js (16.4, `next
// start`) gives them no socket and no `request.ip` (removed in Next 15); it only sets
// X-Forwarded-For from the socket when the client sent none (base-server.js:
// `req.headers['x-forwarded-for'] ??= socket.remoteAddress`), so a client that sends the
// header chooses what the app sees. instrumentation.ts therefore calls installPeerStamp() once
// per process: every incoming request gets the header below, overwriting anything a client
// sent, carrying a random per-process secret and the socket's address. readPeerStamp() accepts
// only values with that secret, so a client-written copy is ignored even if a request slipped
// past the stamp (those that arrive while the server is still starting, before instrumentation
// ran, count as 'unknown'). No custom server: `npm start` still runs `next start`.
// Not 'server-only' and no framework imports: instrumentation loads it outside React's server
// layer. The server side reads it through lib/server/platform/client-address.ts.

export const PEER_HEADER = 'x-notchwise-peer';

type Holder = { [k: symbol]: unknown };
const g = globalThis as unknown as Holder;
const SECRET = Symbol.for('notchwise.peer-stamp.secret');
const INSTALLED = Symbol.for('notchwise.peer-stamp.installed');

function secret(): string {
  g[SECRET] ??= randomBytes(18).toString('base64url');
  return g[SECRET] as string;
}

/** The header value for a socket address (also how tests stand in for `next start`). */
export function peerStamp(address: string): string {
  return `${secret()} ${address}`;
}

/** The socket's address from a stamped header, or null when the header is missing or forged. */
export function readPeerStamp(value: string | null | undefined): string | null {
  if (!value) return null;
  const s = secret();
  return value.startsWith(`${s} `) ? value.slice(s.length + 1) : null;
}

/** Stamps every request this process's HTTP servers receive (idempotent). */
export function installPeerStamp(http: typeof Http = Http): void {
  if (g[INSTALLED]) return;
  g[INSTALLED] = true;
  const proto = http.Server.prototype as unknown as { emit: (event: string | symbol, ...args: unknown[]) => boolean };
  const emit = proto.emit;
  proto.emit = function stampedEmit(this: unknown, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const req = args[0] as Http.IncomingMessage;
      req.headers[PEER_HEADER] = peerStamp(req.socket?.remoteAddress ?? '');
    }
    return emit.call(this, event, ...args);
  };
}
