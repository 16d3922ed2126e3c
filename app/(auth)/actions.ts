'use server';
import { AuthError } from 'next-auth';
import { signIn, signOut } from '@/lib/server/team/auth';
import { signUp } from '@/lib/server/team/accounts';
import { actionResult } from '@/lib/server/http/action';
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

export async function signInAction(input: unknown, next?: string | null) {
  return actionResult(async () => {
    const data = signInSchema.parse(input);
    const ip = await actionClientIp();
    await limit('sign-in-ip', ip);
    await limit('sign-in-email', `${ip}|${data.email.toLowerCase()}`);
    await startSession(data.email, data.password);
    const [first] = await listWorkspacesByEmail(data.email);
    return { redirectTo: safeNextPath(next) ?? (first ? `/w/${first.slug}` : '/') };
  });
}

export async function signUpAction(input: unknown) {
  return actionResult(async () => {
    const data = signUpSchema.parse(input);
    await limit('sign-up-ip', await actionClientIp());
    const { workspaceSlug } = await signUp(data);
    await startSession(data.email, data.password);
    return { redirectTo: `/w/${workspaceSlug}` };
  });
}

export async function signOutAction() {
  await signOut({ redirectTo: '/sign-in' });
}
