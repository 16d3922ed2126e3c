import { describe, expect, it, vi } from 'vitest';
import { DEV_WEBHOOK_SECRET, parseEnv } from '@/lib/env-schema';

const good = { DATABASE_URL: 'postgresql://postgres@127.0.0.1:54329/notchwise', AUTH_SECRET: 'x'.repeat(32) };

describe('environment parsing', () => {
  it('fills defaults', () => {
    const env = parseEnv(good);
    expect(env.APP_URL).toBe('http://127.0.0.1:3000');
    expect(env.SMTP_PORT).toBe(1025);
    expect(env.RUN_WORKER).toBe(true);
  });
  it('parses booleans explicitly', () => {
    expect(parseEnv({ ...good, RUN_WORKER: 'false' }).RUN_WORKER).toBe(false);
    expect(parseEnv({ ...good, RUN_WORKER: '0' }).RUN_WORKER).toBe(false);
    expect(parseEnv({ ...good, SECURE_COOKIES: 'yes' }).SECURE_COOKIES).toBe(true);
    expect(() => parseEnv({ ...good, RUN_WORKER: 'maybe' })).toThrowError(/RUN_WORKER/);
  });
  it('names every bad variable in one clear error', () => {
    let message = '';
    try {
      parseEnv({ DATABASE_URL: 'mysql://nope', AUTH_SECRET: 'short', SMTP_PORT: 'abc' });
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toMatch(/^Invalid environment:/);
    expect(message).toMatch(/DATABASE_URL: must be a postgresql:\/\/ URL/);
    expect(message).toMatch(/AUTH_SECRET: must be at least 32 characters/);
    expect(message).toMatch(/SMTP_PORT/);
  });
  it('requires the database URL', () => {
    expect(() => parseEnv({ AUTH_SECRET: 'x'.repeat(32) })).toThrowError(/DATABASE_URL/);
  });

  // Issue 13, finding 12: a missing webhook secret fell back to a public constant everywhere.
  it('production needs its own Stripe webhook secret: missing or the public development value is refused', () => {
    const prod = { ...good, NODE_ENV: 'production' };
    expect(() => parseEnv(prod)).toThrowError(/STRIPE_WEBHOOK_SECRET: required in production/);
    expect(() => parseEnv({ ...prod, STRIPE_WEBHOOK_SECRET: DEV_WEBHOOK_SECRET })).toThrowError(/STRIPE_WEBHOOK_SECRET: the public development value/);
    expect(parseEnv({ ...prod, STRIPE_WEBHOOK_SECRET: 'whsec_own_0123456789' }).STRIPE_WEBHOOK_SECRET).toBe('whsec_own_0123456789');
    expect(parseEnv(good).STRIPE_WEBHOOK_SECRET).toBe(DEV_WEBHOOK_SECRET);
  });

  it('the Next.js server refuses to start without it (instrumentation.ts exits before serving)', async () => {
    const { register } = await import('@/instrumentation');
    const exit = vi.spyOn(process, 'exit').mockImplementation((() => undefined) as never);
    const error = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const saved = { ...process.env };
    try {
      Object.assign(process.env, { ...good, NODE_ENV: 'production', NEXT_RUNTIME: 'nodejs' });
      delete process.env.STRIPE_WEBHOOK_SECRET;
      delete process.env.NEXT_PHASE;
      await register();
      expect(exit).toHaveBeenCalledWith(1);
      expect(String(error.mock.calls[0]?.[0])).toMatch(/STRIPE_WEBHOOK_SECRET/);
      exit.mockClear();
      process.env.STRIPE_WEBHOOK_SECRET = 'whsec_own_0123456789';
      await register();
      expect(exit).not.toHaveBeenCalled();
    } finally {
      for (const k of Object.keys(process.env)) if (!(k in saved)) delete process.env[k];
      Object.assign(process.env, saved);
      exit.mockRestore();
      error.mockRestore();
    }
  });
});
