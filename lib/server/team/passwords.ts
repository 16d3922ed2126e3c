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

let dummy: Promise<string> | undefined;

/**
 * Spends the same bcrypt work as checking a real password, for an address with no account:
 * sign-in then takes as long for unknown addresses as for known ones (no account discovery by
 * timing). The dummy hash is made once per process at the configured cost.
 */
export async function verifyAgainstDummy(password: string): Promise<false> {
  dummy ??= hashPassword('no account has this password, it only costs time');
  await bcrypt.compare(password, await dummy);
  return false;
}
