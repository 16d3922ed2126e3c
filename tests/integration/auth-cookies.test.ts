import { describe, expect, it, vi } from 'vitest';

// The production setting: SECURE_COOKIES on (or an https APP_URL). Read when the env is parsed.
vi.hoisted(() => {
  process.env.SECURE_COOKIES = '1';
  process.env.APP_URL = 'https://notchwise.test';
});

import { NextRequest } from 'next/server';
import { GET, POST } from '@/app/api/auth/[...nextauth]/route';
import { makeWorkspace } from '../support/factories';

const pair = (c: string) => c.split(';')[0];

describe('Auth.js cookies with SECURE_COOKIES on', () => {
  it('the CSRF and session cookies are Secure, HttpOnly, SameSite=Lax, with the __Host-/__Secure- prefixes', async () => {
    const ws = await makeWorkspace();
    const csrf = await GET(new NextRequest('https://notchwise.test/api/auth/csrf'));
    const { csrfToken } = await csrf.json();
    const csrfCookies = csrf.headers.getSetCookie();
    expect(csrfCookies.some((c) => c.startsWith('__Host-authjs.csrf-token='))).toBe(true);
    for (const c of csrfCookies) {
      expect(c).toMatch(/;\s*Secure/i);
      expect(c).toMatch(/;\s*HttpOnly/i);
    }

    const res = await POST(new NextRequest('https://notchwise.test/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: csrfCookies.map(pair).join('; '), 'x-forwarded-for': '10.88.0.1' },
      body: new URLSearchParams({ csrfToken, email: ws.owner.email, password: 'long-enough-password', callbackUrl: 'https://notchwise.test/' }),
    }));
    const session = res.headers.getSetCookie().find((c) => c.startsWith('__Secure-authjs.session-token='));
    expect(session, res.headers.getSetCookie().join('\n')).toBeTruthy();
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });
});
