import { BlockList, isIP } from 'node:net';

// Which address a request came from, decided by configuration rather than by what the client
// sends. Pure code (no framework, no environment): the server module
// lib/server/platform/client-address.ts feeds it the socket's address and TRUSTED_PROXIES,
// and tests/unit/client-address.test.ts runs every case.
//
// The chain is the X-Forwarded-For entries followed by the socket's address (the app appends
// its own hop, as a proxy would). TRUSTED_PROXIES says how much of it to believe:
//   unset, '' or '0'   no proxy: the socket's address; any X-Forwarded-For is the client's word
//   a count N          N proxies of ours in front: the entry N places left of the socket
//   CIDR list          walk from the socket leftwards past addresses of our proxies; the first
//                      address outside the list is the client
// Entries that are not IP addresses end the walk (a proxy of ours never writes one), so a client
// cannot smuggle a name or garbage in as its address.

export type TrustedProxies = { hops: number } | { cidrs: string[] };

const CIDR = /^([0-9a-fA-F:.]+)(?:\/(\d{1,3}))?$/;

/** Parses TRUSTED_PROXIES; throws with a readable message on a bad value. */
export function parseTrustedProxies(raw: string | undefined): TrustedProxies {
  const v = (raw ?? '').trim();
  if (v === '') return { hops: 0 };
  if (/^\d+$/.test(v)) {
    const hops = Number(v);
    if (hops > 10) throw new Error('a hop count above 10 is not a real set-up');
    return { hops };
  }
  const cidrs = v.split(',').map((s) => s.trim()).filter(Boolean);
  for (const c of cidrs) {
    const m = CIDR.exec(c);
    const family = m ? isIP(m[1]) : 0;
    if (!m || !family) throw new Error(`"${c}" is neither an address nor a CIDR range`);
    if (m[2] !== undefined && Number(m[2]) > (family === 4 ? 32 : 128)) throw new Error(`"${c}" has a prefix longer than the address`);
  }
  return { cidrs };
}

/** '::ffff:10.0.0.1' → '10.0.0.1'; '[::1]:443' and '10.0.0.1:80' lose their ports; not an IP → null. */
export function normaliseAddress(raw: string | null | undefined): string | null {
  if (!raw) return null;
  let s = raw.trim();
  const bracket = /^\[([^\]]+)\](?::\d+)?$/.exec(s);
  if (bracket) s = bracket[1];
  else if (/^\d+\.\d+\.\d+\.\d+:\d+$/.test(s)) s = s.slice(0, s.lastIndexOf(':'));
  if (/^::ffff:\d+\.\d+\.\d+\.\d+$/i.test(s)) s = s.slice(7);
  s = s.toLowerCase();
  return isIP(s) ? s : null;
}

function blockList(cidrs: string[]): BlockList {
  const list = new BlockList();
  for (const c of cidrs) {
    const [addr, prefix] = c.split('/');
    const a = normaliseAddress(addr)!;
    const type = isIP(a) === 6 ? 'ipv6' : 'ipv4';
    if (prefix === undefined) list.addAddress(a, type);
    else list.addSubnet(a, Number(prefix), type);
  }
  return list;
}

const lists = new Map<string, BlockList>();

/**
 * The client's address from the socket's address, the X-Forwarded-For header and the trust
 * setting. `socket` null means the socket is unknown (not served by `next start`): the answer
 * is then 'unknown', one shared key, never a client-chosen one.
 */
export function resolveClientAddress(socket: string | null, forwardedFor: string | null, trust: TrustedProxies): string {
  const peer = normaliseAddress(socket);
  if (!peer) return 'unknown';
  if ('hops' in trust && trust.hops === 0) return peer;
  const forwarded = (forwardedFor ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  const chain = [...forwarded, peer];
  if ('hops' in trust) {
    // Walk left past our N proxies; a hop that is not an address stops the walk at the last good one.
    let client = peer;
    for (let i = chain.length - 2, n = 0; i >= 0 && n < trust.hops; i--, n++) {
      const a = normaliseAddress(chain[i]);
      if (!a) break;
      client = a;
    }
    return client;
  }
  const key = trust.cidrs.join(',');
  let list = lists.get(key);
  if (!list) lists.set(key, (list = blockList(trust.cidrs)));
  let client = peer;
  for (let i = chain.length - 1; i >= 0; i--) {
    const a = normaliseAddress(chain[i]);
    if (!a) break;
    client = a;
    if (!list.check(a, isIP(a) === 6 ? 'ipv6' : 'ipv4')) return a;
  }
  return client;
}
