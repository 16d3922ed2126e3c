import { randomInt } from 'node:crypto';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { baseUrl, openBrowser } from '../support/browser';
import { cspDirectives } from '../support/csp';
import { mailedLink, signUpAndConfirm } from '../support/e2e-accounts';

// Against the built app over real HTTP: the security headers it serves, the Auth.js cookie
// flags of a credentials sign-in, and an old session refused after a password reset.

const ip = () => `10.77.${randomInt(1, 250)}.${randomInt(1, 250)}`;
const cookiePair = (setCookie: string) => setCookie.split(';')[0];

/** Signs in the way a non-browser client does: CSRF token, then the credentials callback. */
async function httpSignIn(email: string, password: string) {
  const from = ip();
  const csrf = await fetch(`${baseUrl()}/api/auth/csrf`, { headers: { 'x-forwarded-for': from } });
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const jar = csrf.headers.getSetCookie().map(cookiePair).join('; ');
  const res = await fetch(`${baseUrl()}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar, 'x-forwarded-for': from },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: baseUrl() }),
  });
  const session = res.headers.getSetCookie().find((c) => /authjs\.session-token=/.test(c));
  return { res, csrfCookies: csrf.headers.getSetCookie(), session };
}

/** A POST from a chosen loopback source address (the socket `next start` sees); returns the status. */
function fromAddress(localAddress: string, path: string, headers: Record<string, string>, body: string): Promise<number> {
  const url = new URL(path, baseUrl());
  return new Promise((resolve, reject) => {
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', localAddress, headers: { ...headers, 'content-length': Buffer.byteLength(body) } }, (res) => {
      res.resume();
      res.on('end', () => resolve(res.statusCode ?? 0));
    });
    req.on('error', reject);
    req.end(body);
  });
}

const me = (cookie: string) => fetch(`${baseUrl()}/api/me`, { headers: { cookie } });

describe('security over HTTP', () => {
  let context: BrowserContext;
  let page: Page;
  const email = `cookie-${Date.now()}@test.example`;
  const first = 'first-password-123';
  const second = 'second-password-456';

  /** Anything the browser refused under the Content-Security-Policy (must stay empty). */
  const blocked: string[] = [];
  beforeAll(async () => {
    ({ context, page } = await openBrowser());
    page.on('console', (m) => {
      if (/Content Security Policy|Refused to/i.test(m.text())) blocked.push(m.text());
    });
    await signUpAndConfirm(page, { name: 'Cookie Check', email, password: first, workspaceName: `Cookie lab ${Date.now()}` });
  });
  afterAll(async () => {
    await context?.close();
  });

  it('pages and API routes carry CSP, frame-ancestors none, nosniff and a referrer policy', async () => {
    for (const p of ['/sign-in', '/api/me']) {
      const res = await fetch(`${baseUrl()}${p}`, { redirect: 'manual' });
      const csp = cspDirectives(res.headers.get('content-security-policy'));
      expect(csp.get('frame-ancestors'), p).toEqual(["'none'"]);
      if (p === '/api/me') {
        // JSON is data: route() gives it a policy that allows nothing (tests/e2e/security-csp.test.ts).
        expect(csp.get('default-src'), p).toEqual(["'none'"]);
      } else {
        expect(csp.get('default-src'), p).toEqual(["'self'"]);
        expect(csp.get('object-src'), p).toEqual(["'none'"]);
        expect(csp.get('img-src'), p).toEqual(["'self'", 'data:', 'blob:']); // QR codes are data: URLs
        expect(csp.get('form-action')?.[0], p).toBe("'self'");
        expect(csp.get('form-action'), p).toHaveLength(2); // and the checkout page
      }
      expect(res.headers.get('x-content-type-options'), p).toBe('nosniff');
      expect(res.headers.get('referrer-policy'), p).toBe('strict-origin-when-cross-origin');
      expect(res.headers.get('x-frame-options'), p).toBe('DENY');
      expect(res.headers.get('x-powered-by'), p).toBeNull();
    }
  });

  it('respondent pages and endpoints: one strict policy with no inline script or style, never cached, the same other headers', async () => {
    const token = 'not-a-real-link-token';
    for (const p of [`/r/${token}`, `/r/${token}/take-part`, `/r/${token}/state`]) {
      const res = await fetch(`${baseUrl()}${p}`, { redirect: 'manual' });
      expect(res.status, p).toBe(404);
      // cspDirectives throws if the app's global policy were sent as well.
      const csp = cspDirectives(res.headers.get('content-security-policy'));
      expect(csp.get('script-src'), p).toEqual(["'self'"]);
      expect(csp.get('style-src'), p).toEqual(["'self'"]);
      expect(csp.get('default-src'), p).toEqual(["'self'"]);
      expect(csp.get('form-action'), p).toEqual(["'self'"]);
      expect(csp.get('frame-ancestors'), p).toEqual(["'none'"]);
      expect(csp.get('object-src'), p).toEqual(["'none'"]);
      expect(res.headers.get('cache-control'), p).toBe('no-store');
      expect(res.headers.get('x-content-type-options'), p).toBe('nosniff');
      expect(res.headers.get('x-frame-options'), p).toBe('DENY');
    }
    // The item picture is the one respondent response the no-store rule leaves to its handler.
    const picture = await fetch(`${baseUrl()}/r/${token}/picture`);
    expect(picture.status).toBe(404);
    expect(picture.headers.get('cache-control')).not.toBe('no-store');
    expect(cspDirectives(picture.headers.get('content-security-policy')).get('script-src')).toEqual(["'self'"]);
  });

  it('a credentials sign-in sets an HttpOnly, SameSite=Lax session cookie (not Secure on this plain-HTTP test address)', async () => {
    const { res, session, csrfCookies } = await httpSignIn(email, first);
    expect(res.status).toBe(302);
    expect(session).toBeTruthy();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
    // APP_URL is http:// here and SECURE_COOKIES unset: no Secure flag, no __Secure- prefix
    // (the integration test auth-cookies.test.ts checks the https case).
    expect(session).not.toMatch(/;\s*Secure/i);
    for (const c of csrfCookies) expect(c).toMatch(/;\s*HttpOnly/i);
    expect((await me(cookiePair(session!))).status).toBe(200);
  });

  it('hammering one account over the credentials callback: 429 with Retry-After after ten wrong passwords, whatever X-Forwarded-For says', async () => {
    const target = `nobody-${Date.now()}@test.example`;
    const csrf = await fetch(`${baseUrl()}/api/auth/csrf`);
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const cookie = csrf.headers.getSetCookie().map(cookiePair).join('; ');
    const post = () => fetch(`${baseUrl()}/api/auth/callback/credentials`, {
      method: 'POST', redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie, 'x-forwarded-for': ip() },
      body: new URLSearchParams({ csrfToken, email: target, password: 'guess-0000000' }),
    });
    for (let i = 0; i < 10; i++) expect((await post()).status).not.toBe(429);
    const res = await post();
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect((await res.json()).error.message).toMatch(/Too many wrong passwords for this account/);
  });

  it('the per-address limit counts the socket `next start` saw: 100 sign-ins from 127.0.0.2 with rotating X-Forwarded-For, then 429; 127.0.0.3 is unaffected', async () => {
    const csrf = await fetch(`${baseUrl()}/api/auth/csrf`);
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const cookie = csrf.headers.getSetCookie().map(cookiePair).join('; ');
    const post = (from: string) => fromAddress(from, '/api/auth/callback/credentials', {
      'content-type': 'application/x-www-form-urlencoded', cookie, 'x-forwarded-for': ip(), 'x-real-ip': ip(),
    }, new URLSearchParams({ csrfToken, email: `spray-${randomInt(1e9)}@test.example`, password: 'guess-0000000' }).toString());
    for (let i = 0; i < 100; i++) expect(await post('127.0.0.2')).not.toBe(429);
    expect(await post('127.0.0.2')).toBe(429);
    expect(await post('127.0.0.3')).not.toBe(429);
  }, 120_000);

  it('a session cookie copied before sign-out is dead after it (the server voids the session, not only the browser)', async () => {
    const copied = cookiePair((await httpSignIn(email, first)).session!);
    expect((await me(copied)).status).toBe(200);
    const csrf = await fetch(`${baseUrl()}/api/auth/csrf`, { headers: { cookie: copied } });
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const jar = [copied, ...csrf.headers.getSetCookie().map(cookiePair)].join('; ');
    const out = await fetch(`${baseUrl()}/api/auth/signout`, {
      method: 'POST', redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: jar },
      body: new URLSearchParams({ csrfToken, callbackUrl: baseUrl() }),
    });
    expect(out.status).toBeLessThan(400);
    expect((await me(copied)).status).toBe(401);
    // Signing in again works and gives a live session.
    const again = cookiePair((await httpSignIn(email, first)).session!);
    expect((await me(again)).status).toBe(200);
  });

  it('a wrong password sets no session cookie', async () => {
    const { session } = await httpSignIn(email, 'not-the-password-1');
    expect(session).toBeUndefined();
  });

  it("after a password reset the old session's cookie gets 401 from /api/me; the new password signs in", async () => {
    const old = cookiePair((await httpSignIn(email, first)).session!);
    expect((await me(old)).status).toBe(200);

    const { context: other, page: p2 } = await openBrowser();
    try {
      await p2.goto(`${baseUrl()}/reset`);
      await p2.getByLabel('E-mail').fill(email);
      await p2.getByRole('button', { name: 'Send the link' }).click();
      await p2.goto(await mailedLink(email, 'reset'));
      await p2.getByLabel('New password').fill(second);
      await p2.getByLabel('The same again').fill(second);
      await p2.getByRole('button', { name: 'Save the new password' }).click();
      await p2.waitForURL(/\/w\//);
    } finally {
      await other.close();
    }

    expect((await me(old)).status).toBe(401);
    await page.goto(`${baseUrl()}/sign-in`);
    expect(blocked).toEqual([]);
    // The browser signed in before the reset is signed out too.
    expect((await page.request.get(`${baseUrl()}/api/me`)).status()).toBe(401);
    expect((await httpSignIn(email, first)).session).toBeUndefined();
    const fresh = (await httpSignIn(email, second)).session;
    expect((await me(cookiePair(fresh!))).status).toBe(200);
  });
});
