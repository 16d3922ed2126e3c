import { describe, expect, it } from 'vitest';
import { normaliseAddress, parseTrustedProxies, resolveClientAddress } from '@/lib/client-address';
import { peerStamp, readPeerStamp } from '@/lib/peer-stamp';
import { parseEnv } from '@/lib/env-schema';

// Issue 13, finding 1: the client address was the first hop of a client-sent X-Forwarded-For.
describe('client address from the socket and TRUSTED_PROXIES', () => {
  const none = parseTrustedProxies(undefined);

  it('without a trusted proxy it is the socket, whatever the forwarded headers say', () => {
    expect(resolveClientAddress('203.0.113.7', '1.2.3.4', none)).toBe('203.0.113.7');
    expect(resolveClientAddress('203.0.113.7', null, none)).toBe('203.0.113.7');
    expect(resolveClientAddress('::ffff:203.0.113.7', '1.2.3.4, 5.6.7.8', none)).toBe('203.0.113.7');
    expect(resolveClientAddress(null, '1.2.3.4', none)).toBe('unknown');
    expect(resolveClientAddress('', '1.2.3.4', none)).toBe('unknown');
  });

  it('a hop count trusts exactly that many proxies of ours, counted from the socket', () => {
    const one = parseTrustedProxies('1');
    // client 198.51.100.9 → our proxy 10.0.0.2 (appends the client) → app; a forged first entry is ignored.
    expect(resolveClientAddress('10.0.0.2', '6.6.6.6, 198.51.100.9', one)).toBe('198.51.100.9');
    expect(resolveClientAddress('10.0.0.2', '198.51.100.9', one)).toBe('198.51.100.9');
    const two = parseTrustedProxies('2');
    expect(resolveClientAddress('10.0.0.3', '6.6.6.6, 198.51.100.9, 10.0.0.2', two)).toBe('198.51.100.9');
    // Fewer hops than configured (the proxy was bypassed): the leftmost real address, never a guess.
    expect(resolveClientAddress('198.51.100.9', null, one)).toBe('198.51.100.9');
    // Garbage where an address should be stops the walk.
    expect(resolveClientAddress('10.0.0.2', 'evil-name', one)).toBe('10.0.0.2');
  });

  it('a CIDR list skips our proxies from the right; the first outside address is the client', () => {
    const cidrs = parseTrustedProxies('10.0.0.0/8, fd00::/8');
    expect(resolveClientAddress('10.0.0.3', '6.6.6.6, 198.51.100.9, 10.1.2.3', cidrs)).toBe('198.51.100.9');
    expect(resolveClientAddress('fd00::1', '2001:db8::5', cidrs)).toBe('2001:db8::5');
    // A direct connection from outside the list: the socket, however X-Forwarded-For rotates.
    expect(resolveClientAddress('198.51.100.20', '10.9.9.9', cidrs)).toBe('198.51.100.20');
  });

  it('rotating X-Forwarded-For never changes the answer without a trusted proxy', () => {
    const seen = new Set<string>();
    for (let i = 0; i < 50; i++) seen.add(resolveClientAddress('203.0.113.7', `10.${i}.0.1`, none));
    expect([...seen]).toEqual(['203.0.113.7']);
  });

  it('parses and refuses TRUSTED_PROXIES values; the env schema refuses a bad one at start', () => {
    expect(parseTrustedProxies('')).toEqual({ hops: 0 });
    expect(parseTrustedProxies('0')).toEqual({ hops: 0 });
    expect(parseTrustedProxies('2')).toEqual({ hops: 2 });
    expect(parseTrustedProxies('10.0.0.0/8,192.168.1.1')).toEqual({ cidrs: ['10.0.0.0/8', '192.168.1.1'] });
    expect(() => parseTrustedProxies('10.0.0.0/33')).toThrow(/prefix/);
    expect(() => parseTrustedProxies('proxy.internal')).toThrow(/neither an address nor a CIDR/);
    expect(() => parseTrustedProxies('99')).toThrow();
    const base = { DATABASE_URL: 'postgresql://x@127.0.0.1/db', AUTH_SECRET: 'a'.repeat(32) };
    expect(() => parseEnv({ ...base, TRUSTED_PROXIES: 'everyone' })).toThrow(/TRUSTED_PROXIES/);
    expect(parseEnv(base).TRUSTED_PROXIES).toBe('');
  });

  it('normalises ports, brackets and IPv4-mapped IPv6; anything else is not an address', () => {
    expect(normaliseAddress('[::1]:443')).toBe('::1');
    expect(normaliseAddress('10.0.0.1:80')).toBe('10.0.0.1');
    expect(normaliseAddress('::FFFF:10.0.0.1')).toBe('10.0.0.1');
    expect(normaliseAddress('unknown')).toBeNull();
  });

  it('the socket stamp is believed only with this process\'s secret', () => {
    expect(readPeerStamp(peerStamp('10.1.1.1'))).toBe('10.1.1.1');
    expect(readPeerStamp('x 10.1.1.1')).toBeNull();
    expect(readPeerStamp(`${peerStamp('')}`)).toBe('');
    expect(readPeerStamp(null)).toBeNull();
  });
});
