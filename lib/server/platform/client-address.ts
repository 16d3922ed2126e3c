import 'server-only';
import { headers } from 'next/headers';
import { parseTrustedProxies, resolveClientAddress, type TrustedProxies } from '@/lib/client-address';
import { PEER_HEADER, readPeerStamp } from '@/lib/peer-stamp';
import { env } from './env';

// The one place the app reads a client's address (rate limits, and anything else that ever
// needs one). The socket's address comes from the per-process stamp lib/peer-stamp.ts puts on
// every request (Next.js exposes no socket to route handlers); X-Forwarded-For counts only as
// far as TRUSTED_PROXIES says (lib/client-address.ts: a hop count or a CIDR list of our own
// proxies). Unset, a client-sent X-Forwarded-For or X-Real-IP is ignored, so rotating it buys
// an attacker nothing. Tests: tests/unit/client-address.test.ts, tests/integration/rate-limits.test.ts.

let trust: { raw: string; parsed: TrustedProxies } | undefined;

function trusted(): TrustedProxies {
  const raw = env().TRUSTED_PROXIES;
  if (trust?.raw !== raw) trust = { raw, parsed: parseTrustedProxies(raw) };
  return trust.parsed;
}

/** The client's address for a request's headers ('unknown' when the socket is not known). */
export function clientAddress(h: Headers): string {
  return resolveClientAddress(readPeerStamp(h.get(PEER_HEADER)), h.get('x-forwarded-for'), trusted());
}

/** The client's address inside a server action (outside a request, e.g. a script: 'unknown'). */
export async function actionClientAddress(): Promise<string> {
  try {
    return clientAddress(await headers());
  } catch {
    return 'unknown';
  }
}
