import 'server-only';
import { createHash, randomBytes } from 'node:crypto';

/** SHA-256 hex of a token: only the hash is stored, the token travels by e-mail. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A fresh single-use token (32 random bytes) and its hash. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}
