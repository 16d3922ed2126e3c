'use server';
import { AuthError } from 'next-auth';
import { signIn, signOut } from '@/lib/server/team/auth';
import { signUp } from '@/lib/server/team/accounts';
import { action, formAction } from '@/lib/server/http/action';
import { AppError } from '@/lib/server/http/errors';
import { listWorkspacesByEmail } from '@/lib/server/team/membership';
import { actionClientIp, limit } from '@/lib/server/platform/rate-limit';
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
    const ip = await actionClientIp();
    await limit('sign-in-ip', ip);
    await limit('sign-in-email', `${ip}|${data.email.toLowerCase()}`);
    await startSession(data.email, data.password);
    const [first] = await listWorkspacesByEmail(data.email);
    return { redirectTo: safeNextPath(next) ?? (first ? `/w/${first.slug}` : '/') };
  },
);

export const signUpAction = action(
  { auth: 'public', reason: 'creates a new account and its own new workspace; touches no existing one' },
  async (_caller, input: unknown) => {
    const data = signUpSchema.parse(input);
    await limit('sign-up-ip', await actionClientIp());
    const { workspaceSlug } = await signUp(data);
    await startSession(data.email, data.password);
    return { redirectTo: `/w/${workspaceSlug}` };
  },
);

export const signOutAction = formAction({ auth: 'public', reason: "ends the caller's own session, if any" }, async () => {
  await signOut({ redirectTo: '/sign-in' });
});
