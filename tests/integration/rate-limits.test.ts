import { randomInt } from 'node:crypto';
import { beforeAll, describe, expect, it, vi } from 'vitest';

// A low per-IP start limit for this file only (read when the env is first parsed).
vi.hoisted(() => {
  process.env.RATE_LIMIT_RESPONDENT_PER_MIN = '3';
});

// Server actions read the client address from next/headers. The test plays `next start`: the
// socket's address arrives in the stamped header (lib/peer-stamp.ts), and the client adds an
// X-Forwarded-For of its choosing (rotating, as in issue 13's finding 1).
const client = vi.hoisted(() => ({ socket: '10.0.0.1', forwarded: '10.9.9.9' }));
vi.mock('next/headers', async () => {
  const { PEER_HEADER, peerStamp } = await import('@/lib/peer-stamp');
  return {
    headers: async () => new Headers({ [PEER_HEADER]: peerStamp(client.socket), 'x-forwarded-for': client.forwarded, 'x-real-ip': client.forwarded }),
    cookies: async () => ({ get: () => undefined, getAll: () => [], has: () => false, set: () => undefined, delete: () => undefined }),
  };
});

import { PEER_HEADER, peerStamp } from '@/lib/peer-stamp';
import { GET as authGet, POST as authPost } from '@/app/api/auth/[...nextauth]/route';
import { signUpAction } from '@/app/(auth)/actions';
import { requestResetAction } from '@/app/(auth)/reset/actions';
import { callRoute, makeWorkspace, uid } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';
import { startRes } from '../support/respondent-client';

// Counters persist in the reused test database: every run uses fresh addresses and e-mails.
const freshIp = () => `10.${randomInt(1, 250)}.${randomInt(1, 250)}.${randomInt(1, 250)}`;

/** A credentials sign-in over HTTP as a script would do it: CSRF token first, then the callback. */
async function credentialsPost(email: string, socket: string, password = 'wrong-password-123') {
  const headers = { [PEER_HEADER]: peerStamp(socket), 'x-forwarded-for': freshIp() };
  const csrf = await callRoute(authGet as never, { url: 'http://127.0.0.1/api/auth/csrf', params: {}, headers });
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const cookie = csrf.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return callRoute(authPost as never, {
    method: 'POST',
    url: 'http://127.0.0.1/api/auth/callback/credentials',
    params: {},
    rawBody: new URLSearchParams({ email, password, csrfToken, callbackUrl: 'http://127.0.0.1/' }).toString(),
    headers: { ...headers, 'content-type': 'application/x-www-form-urlencoded', cookie },
  });
}

describe('rate limits (PostgreSQL-backed, 429 with Retry-After)', () => {
  it('sign-in over HTTP: after 10 wrong passwords the account is refused with Retry-After, from any address; another account is unaffected', async () => {
    const ws = await makeWorkspace();
    for (let i = 0; i < 10; i++) expect((await credentialsPost(ws.owner.email, freshIp())).status).not.toBe(429);
    const res = await credentialsPost(ws.owner.email, freshIp(), 'long-enough-password');
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    const body = await res.json();
    expect(body.error.code).toBe('rate_limited');
    expect(body.error.message).toMatch(/Too many wrong passwords for this account/);
    expect((await credentialsPost(`other-${uid()}@test.example`, freshIp())).status).not.toBe(429);
  });

  it('sign-in per address: 100 attempts from one socket, then 429, however X-Forwarded-For rotates', async () => {
    const socket = freshIp();
    for (let i = 0; i < 100; i++) expect((await credentialsPost(`spray-${uid()}@test.example`, socket)).status).not.toBe(429);
    expect((await credentialsPost(`spray-${uid()}@test.example`, socket)).status).toBe(429);
    expect((await credentialsPost(`spray-${uid()}@test.example`, freshIp())).status).not.toBe(429);
  }, 120_000);

  it('sign-up: the 21st sign-up from one socket in ten minutes is refused although every one sent another X-Forwarded-For', async () => {
    client.socket = freshIp();
    const attempt = () => {
      client.forwarded = freshIp();
      return signUpAction({ name: 'Someone', email: `s-${uid()}@test.example`, password: 'long-enough-password', workspaceName: `Rate ${uid()}` });
    };
    for (let i = 0; i < 20; i++) expect(await attempt()).toMatchObject({ ok: true });
    expect(await attempt()).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts/) });
    client.socket = freshIp();
    expect(await attempt()).toMatchObject({ ok: true });
  });

  it('password reset requests: five per e-mail address, thirty per socket, rotating X-Forwarded-For or not', async () => {
    client.socket = freshIp();
    const email = `nobody-${uid()}@test.example`;
    for (let i = 0; i < 5; i++) expect((await requestResetAction({ email })).ok).toBe(true);
    expect(await requestResetAction({ email })).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts/) });
    for (let i = 0; i < 24; i++) {
      client.forwarded = freshIp();
      expect((await requestResetAction({ email: `r-${uid()}@test.example` })).ok).toBe(true);
    }
    client.forwarded = freshIp();
    expect(await requestResetAction({ email: `r-${uid()}@test.example` })).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts/) });
    client.socket = freshIp();
    expect((await requestResetAction({ email: `other-${uid()}@test.example` })).ok).toBe(true);
  });

  describe('respondent start per address (limit 3 a minute in this file)', () => {
    let token: string;
    beforeAll(async () => {
      const ws = await makeWorkspace();
      ({ token } = await makeLiveStudy(ws.slug));
    });

    it('the 4th start from one socket is a 429 with Retry-After, whatever X-Forwarded-For says; another socket still starts', async () => {
      const socket = freshIp();
      const h = () => ({ [PEER_HEADER]: peerStamp(socket), 'x-forwarded-for': freshIp(), 'x-real-ip': freshIp() });
      for (let i = 0; i < 3; i++) expect((await startRes(token, undefined, h())).status).toBe(200);
      const res = await startRes(token, undefined, h());
      expect(res.status).toBe(429);
      expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
      expect((await res.json()).error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/Try again/) });
      expect((await startRes(token, undefined, { [PEER_HEADER]: peerStamp(freshIp()) })).status).toBe(200);
    });

    it('a forged stamp (no process secret) counts as the shared unknown address, never as the address it names', async () => {
      const { clientAddress } = await import('@/lib/server/platform/client-address');
      expect(clientAddress(new Headers({ [PEER_HEADER]: 'guess 10.1.2.3', 'x-forwarded-for': '10.1.2.3' }))).toBe('unknown');
      expect(clientAddress(new Headers({ [PEER_HEADER]: peerStamp('::ffff:10.1.2.3'), 'x-forwarded-for': '10.4.4.4' }))).toBe('10.1.2.3');
    });
  });
});
