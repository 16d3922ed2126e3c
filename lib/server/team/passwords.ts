import 'server-only';
import bcrypt from 'bcryptjs';
import { env } from '@/lib/server/platform/env';

// Password hashing, one place: bcrypt (bcryptjs, pure JS, no native build) with the cost factor
// BCRYPT_COST (default 12; tests lower it to stay fast). Tests: tests/unit/passwords.test.ts.

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, env().BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
