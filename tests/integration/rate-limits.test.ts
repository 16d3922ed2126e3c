import { randomInt } from 'node:crypto';
import { beforeAll, describe, expect, it, vi } from 'vitest';

// A low per-IP start limit for this file only (read when the env is first parsed).
vi.hoisted(() => {
  process.env.RATE_LIMIT_RESPONDENT_PER_MIN = '3';
});

// Server actions read the client address from next/headers; the test chooses it per call.
const client = vi.hoisted(() => ({ ip: '10.0.0.1' }));
vi.mock('next/headers', () => ({
  headers: async () => new Headers({ 'x-forwarded-for': `${client.ip}, 10.9.9.9` }),
  cookies: async () => ({ get: () => undefined, getAll: () => [], has: () => false, set: () => undefined, delete: () => undefined }),
}));

import { POST as authPost } from '@/app/api/auth/[...nextauth]/route';
import { signInAction, signUpAction } from '@/app/(auth)/actions';
import { requestResetAction } from '@/app/(auth)/reset/actions';
import { callRoute, makeWorkspace, uid } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';
import { startRes } from '../support/respondent-client';

// Counters persist in the reused test database: every run uses fresh addresses and e-mails.
const freshIp = () => `10.${randomInt(1, 250)}.${randomInt(1, 250)}.${randomInt(1, 250)}`;

function credentialsPost(email: string, ip: string) {
  return callRoute(authPost as never, {
    method: 'POST',
    url: 'http://127.0.0.1/api/auth/callback/credentials',
    params: {},
    rawBody: new URLSearchParams({ email, password: 'wrong-password-123', csrfToken: 'x' }).toString(),
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-forwarded-for': ip },
  });
}

describe('rate limits (PostgreSQL-backed, 429 with Retry-After)', () => {
  it('sign-in over HTTP: the 11th attempt for one address and IP is a 429 with Retry-After; another e-mail or IP is unaffected', async () => {
    const ip = freshIp();
    const email = `victim-${uid()}@test.example`;
    for (let i = 0; i < 10; i++) expect((await credentialsPost(email, ip)).status).not.toBe(429);
    const res = await credentialsPost(email, ip);
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    const body = await res.json();
    expect(body.error.code).toBe('rate_limited');
    expect(body.error.message).toMatch(/Too many attempts/);
    expect((await credentialsPost(`other-${uid()}@test.example`, ip)).status).not.toBe(429);
    expect((await credentialsPost(email, freshIp())).status).not.toBe(429);
  });

  it('the sign-in action returns the 429 message as a form message', async () => {
    const ws = await makeWorkspace();
    client.ip = freshIp();
    const wrong = { email: ws.owner.email, password: 'not-the-password' };
    for (let i = 0; i < 10; i++) {
      const r = await signInAction(wrong);
      expect(r.ok).toBe(false);
      expect(r.ok === false && r.message).not.toMatch(/Too many/);
    }
    const r = await signInAction(wrong);
    expect(r).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts\. Try again in \d+/) });
    client.ip = freshIp();
    const elsewhere = await signInAction(wrong);
    expect(elsewhere.ok === false && elsewhere.message).toMatch(/do not match/);
  });

  it('sign-up: the 21st sign-up from one IP in ten minutes is refused; another IP may sign up', async () => {
    client.ip = freshIp();
    // Invalid input is refused by the schema before counting; these are well-formed attempts.
    const attempt = () => signUpAction({ name: 'Someone', email: `s-${uid()}@test.example`, password: 'long-enough-password', workspaceName: `Rate ${uid()}` });
    for (let i = 0; i < 20; i++) {
      expect(await attempt()).toMatchObject({ ok: true });
    }
    expect(await attempt()).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts/) });
    client.ip = freshIp();
    expect(await attempt()).toMatchObject({ ok: true });
  });

  it('password reset requests: at most five per e-mail address in ten minutes', async () => {
    client.ip = freshIp();
    const email = `nobody-${uid()}@test.example`;
    for (let i = 0; i < 5; i++) expect((await requestResetAction({ email })).ok).toBe(true);
    expect(await requestResetAction({ email })).toMatchObject({ ok: false, message: expect.stringMatching(/Too many attempts/) });
    expect((await requestResetAction({ email: `other-${uid()}@test.example` })).ok).toBe(true);
  });

  describe('respondent start per IP (limit 3 a minute in this file)', () => {
    let token: string;
    beforeAll(async () => {
      const ws = await makeWorkspace();
      ({ token } = await makeLiveStudy(ws.slug));
    });

    it('the 4th start from one IP is a 429 with Retry-After; another IP still starts', async () => {
      const ip = freshIp();
      const h = { 'x-forwarded-for': ip };
      for (let i = 0; i < 3; i++) expect((await startRes(token, undefined, h)).status).toBe(200);
      const res = await startRes(token, undefined, h);
      expect(res.status).toBe(429);
      expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
      expect((await res.json()).error).toMatchObject({ code: 'rate_limited', message: expect.stringMatching(/Try again/) });
      expect((await startRes(token, undefined, { 'x-real-ip': freshIp() })).status).toBe(200);
    });
  });
});
