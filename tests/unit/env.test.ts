import { describe, expect, it } from 'vitest';
import { parseEnv } from '@/lib/env-schema';

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
});
