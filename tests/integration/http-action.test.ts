import { beforeAll, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { action, actionGuard, formAction } from '@/lib/server/http/action';
import { AppError } from '@/lib/server/http/errors';
import type { SessionUser } from '@/lib/server/team/session';
import { makeMember, makeWorkspace, signInAs } from '../support/factories';

// Protects the one server-action guard (lib/server/http/action.ts): a member action
// authorises against the workspace slug it is given before its body runs, a user action needs
// a session, and expected failures come back as values the form shows — never thrown, never
// leaking an unexpected error's text.

describe('action(): who may call', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let other: Awaited<ReturnType<typeof makeWorkspace>>;
  let viewer: SessionUser;
  beforeAll(async () => {
    ws = await makeWorkspace();
    other = await makeWorkspace();
    viewer = await makeMember(ws.slug, 'viewer');
  });

  const body = vi.fn(async (slug: string, name: string) => ({ slug, name }));
  const rename = action({ auth: 'member', role: 'analyst' }, async ({ ctx }, name: string) => body(ctx.workspace.slug, name));

  it('member: signed out, an outsider and a weaker role are refused before the body runs', async () => {
    body.mockClear();
    signInAs(null);
    expect(await rename(ws.slug, 'x')).toEqual({ ok: false, message: 'Sign in first.' });
    signInAs(other.owner);
    expect(await rename(ws.slug, 'x')).toMatchObject({ ok: false, message: 'That workspace was not found.' });
    signInAs(viewer);
    expect(await rename(ws.slug, 'x')).toMatchObject({ ok: false, message: expect.stringMatching(/role/) });
    expect(body).not.toHaveBeenCalled();
  });

  it('member: authorised against the slug it is given, not any workspace the caller belongs to', async () => {
    signInAs(other.owner);
    expect(await rename(other.slug, 'mine')).toEqual({ ok: true, data: { slug: other.slug, name: 'mine' } });
    expect((await rename(ws.slug, 'theirs')).ok).toBe(false);
    signInAs(ws.owner);
    expect(await rename(ws.slug, 'ours')).toEqual({ ok: true, data: { slug: ws.slug, name: 'ours' } });
  });

  it('user: needs a session; public: runs for anyone', async () => {
    const whoAmI = action({ auth: 'user' }, async ({ user }) => user.id);
    signInAs(null);
    expect(await whoAmI()).toEqual({ ok: false, message: 'Sign in first.' });
    signInAs(viewer);
    expect(await whoAmI()).toEqual({ ok: true, data: viewer.id });
    const ping = action({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, async (_c, n: number) => n + 1);
    signInAs(null);
    expect(await ping(1)).toEqual({ ok: true, data: 2 });
    expect(actionGuard(ping)?.spec).toMatchObject({ auth: 'public' });
    expect(actionGuard(async () => 1)).toBeUndefined();
  });
});

describe('action(): what a failure becomes', () => {
  const run = <T>(fn: () => Promise<T>) => action({ auth: 'public', reason: 'a probe for the wrapper test, reads nothing' }, fn)();

  it('a ZodError becomes field errors; an AppError its message and field issues', async () => {
    const schema = z.object({ email: z.email('Enter an e-mail address.') });
    expect(await run(async () => schema.parse({ email: 'nope' }))).toEqual({ ok: false, message: 'Some fields need attention.', fieldErrors: { email: 'Enter an e-mail address.' } });
    expect(await run(async () => {
      throw new AppError(409, 'conflict', 'That name is taken.', [{ path: 'name', message: 'Choose another.' }]);
    })).toEqual({ ok: false, message: 'That name is taken.', fieldErrors: { name: 'Choose another.' } });
  });

  it('an unexpected error is a generic message, nothing from inside', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    try {
      const out = await run(async () => {
        throw new Error('password authentication failed for user "admin"');
      });
      expect(out).toEqual({ ok: false, message: 'Something went wrong on our side. Try again in a moment.' });
    } finally {
      log.mockRestore();
    }
  });

  it("Next.js control flow (redirect, notFound) passes through; a form action's refusal is thrown to the error page", async () => {
    const redirect = Object.assign(new Error('NEXT_REDIRECT'), { digest: 'NEXT_REDIRECT;replace;/sign-in;307;' });
    await expect(run(async () => {
      throw redirect;
    })).rejects.toBe(redirect);
    signInAs(null);
    const leave = formAction({ auth: 'user' }, async () => undefined);
    await expect(leave()).rejects.toThrow('Sign in first.');
  });
});
