import { describe, expect, it } from 'vitest';

process.env.BCRYPT_COST = '4';
process.env.DATABASE_URL ??= 'postgresql://x@127.0.0.1:1/x';
process.env.AUTH_SECRET ??= 'unit-tests-secret-0123456789abcdefghijkl';

describe('password hashing', async () => {
  const { hashPassword, verifyPassword } = await import('@/lib/server/team/passwords');
  it('stores a salted bcrypt hash, never the password', async () => {
    const a = await hashPassword('correct horse battery');
    const b = await hashPassword('correct horse battery');
    expect(a).toMatch(/^\$2[aby]\$04\$/);
    expect(a).not.toContain('correct');
    expect(a).not.toBe(b);
  });
  it('verifies the right password and refuses a wrong one', async () => {
    const h = await hashPassword('correct horse battery');
    expect(await verifyPassword('correct horse battery', h)).toBe(true);
    expect(await verifyPassword('correct horse batterz', h)).toBe(false);
  });
});
