import 'server-only';
import { createHash, randomBytes } from 'node:crypto';

/** 32 random bytes (256 bits), URL-safe: links, resume tokens, invitations, access tokens. */
export function randomToken(): string {
  return randomBytes(32).toString('base64url');
}

/** SHA-256 hex of a token: only the hash is stored, the token itself travels to its holder. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A fresh single-use token and its hash. */
export function newToken(): { token: string; hash: string } {
  const token = randomToken();
  return { token, hash: hashToken(token) };
}
