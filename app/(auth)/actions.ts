'use server';
import { AuthError } from 'next-auth';
import { signIn, signOut } from '@/lib/server/team/auth';
import { SIGN_UP_ANSWER, signUp } from '@/lib/server/team/accounts';
import { checkSignInLimits, revokeCurrentSessions } from '@/lib/server/team/sign-in-guard';
import { action, formAction } from '@/lib/server/http/action';
import { AppError } from '@/lib/server/http/errors';
import { listWorkspacesByEmail } from '@/lib/server/team/membership';
import { limit } from '@/lib/server/platform/rate-limit';
import { actionClientAddress } from '@/lib/server/platform/client-address';
import { signInSchema, signUpSchema } from '@/lib/schemas/auth.schema';
import { safeNextPath } from '@/lib/safe-next';

const WRONG = 'That e-mail address and password do not match an account.';

async function startSession(email: string, password: string) {
  try {
    await signIn('credentials', { email, password, redirect: false });
  } catch (err) {
    if (err instanceof AuthError) throw new AppError(401, 'unauthenticated', WRONG, [{ path: 'password', message: WRONG }]);
    throw err;
  }
}

export const signInAction = action(
  { auth: 'public', reason: 'signing in is how a session starts; the password is the credential, rate-limited' },
  async (_caller, input: unknown, next?: string | null) => {
    const data = signInSchema.parse(input);
    await checkSignInLimits(await actionClientAddress(), data.email);
    await startSession(data.email, data.password);
    const [first] = await listWorkspacesByEmail(data.email);
    return { redirectTo: safeNextPath(next) ?? (first ? `/w/${first.slug}` : '/') };
  },
);

export const signUpAction = action(
  { auth: 'public', reason: 'creates a new account and its own new workspace; touches no existing one' },
  async (_caller, input: unknown) => {
    const data = signUpSchema.parse(input);
    await limit('sign-up-ip', await actionClientAddress());
    // The same answer whether or not the address has an account; the mailbox learns which.
    await signUp(data);
    return { message: SIGN_UP_ANSWER(data.email) };
  },
);

export const signOutAction = formAction({ auth: 'public', reason: "ends the caller's own session, if any" }, async () => {
  await revokeCurrentSessions();
  await signOut({ redirectTo: '/sign-in' });
});
