import 'server-only';
import bcrypt from 'bcryptjs';
import { env } from '@/lib/server/platform/env';

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, env().BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
