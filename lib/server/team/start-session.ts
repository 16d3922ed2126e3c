import 'server-only';
import { AuthError } from 'next-auth';
import { signIn } from './auth';
import { AppError } from '@/lib/server/http/errors';

/** Starts an Auth.js session for credentials the caller has just set or checked. */
export async function startSession(email: string, password: string) {
  try {
    await signIn('credentials', { email, password, redirect: false });
  } catch (err) {
    if (err instanceof AuthError) throw new AppError(401, 'unauthenticated', 'Could not sign you in. Sign in with your new password.');
    throw err;
  }
}
