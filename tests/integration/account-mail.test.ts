import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { startStandIns, mailsTo } from '../support/stand-ins';

// One socket address per call for the actions in this file (lib/peer-stamp.ts plays `next start`).
vi.mock('next/headers', async () => {
  const { PEER_HEADER, peerStamp } = await import('@/lib/peer-stamp');
  return {
    headers: async () => new Headers({ [PEER_HEADER]: peerStamp(`10.51.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`) }),
    cookies: async () => ({ get: () => undefined, getAll: () => [], has: () => false, set: () => undefined, delete: () => undefined }),
  };
});

import { POST as createToken } from '@/app/api/w/[workspace]/tokens/route';
import { GET as v1Studies } from '@/app/api/v1/studies/route';
import { requestResetAction } from '@/app/(auth)/reset/actions';
import { completePasswordReset, RESET_ANSWER } from '@/lib/server/team/password-reset';
import { runAccountMailJob } from '@/lib/server/team/account-mail';
import { em } from '@/lib/server/db/orm';
import { withRequestContext } from '@/lib/server/db/orm';
import { callRoute, makeWorkspace, signInAs, uid } from '../support/factories';
import { linkFromMail } from '../support/mail-jobs';

let stop: () => void;
beforeAll(async () => (stop = await startStandIns()));
afterAll(() => stop?.());

const queuedResets = async (email: string) =>
  Number((await (await em()).execute<{ n: string }[]>("select count(*) as n from pgboss.job where name = 'mail' and data->>'mail' = 'reset' and data->>'email' = ?", [email]))[0].n);

describe('account e-mail after the answer', () => {
  it('a reset request answers the same for a known and an unknown address, doing the same work: one queued job each', async () => {
    // Issue 13, finding 7: the reset mail was sent inside the request (548 ms vs 20 ms).
    const ws = await makeWorkspace();
    const unknown = `nobody-${uid()}@test.example`;
    const known = await requestResetAction({ email: ws.owner.email });
    const none = await requestResetAction({ email: unknown });
    expect(known).toEqual({ ok: true, data: { message: RESET_ANSWER } });
    expect(none).toEqual(known);
    expect(await queuedResets(ws.owner.email)).toBe(1);
    expect(await queuedResets(unknown)).toBe(1);
    await linkFromMail(ws.owner.email, 'reset');
    expect(await mailsTo(unknown)).toEqual([]);
  });

  it('a relay failure does not change the answer: the job fails and is retried, the request never sees it', async () => {
    const ws = await makeWorkspace();
    const answer = await requestResetAction({ email: ws.owner.email });
    expect(answer).toEqual({ ok: true, data: { message: RESET_ANSWER } });
    // The worker's view: with the relay unreachable the job throws (pg-boss retries it later).
    const { env } = await import('@/lib/server/platform/env');
    const e = env() as { SMTP_PORT: number };
    const port = e.SMTP_PORT;
    const holder = globalThis as { mailTransport?: unknown };
    const transport = holder.mailTransport;
    try {
      e.SMTP_PORT = 9; // discard port: nothing listens
      holder.mailTransport = undefined;
      await expect(withRequestContext(() => runAccountMailJob({ kind: 'account-mail', mail: 'reset', email: ws.owner.email }))).rejects.toThrow();
    } finally {
      e.SMTP_PORT = port;
      holder.mailTransport = transport;
    }
    // The retry goes through once the relay is back.
    expect(await linkFromMail(ws.owner.email, 'reset')).toMatch(/^[\w-]{43}$/);
  });

  it('a password reset revokes the account holder\'s API tokens', async () => {
    // Issue 13, finding 8: API tokens survived a password reset.
    const ws = await makeWorkspace();
    signInAs(ws.owner);
    const made = await (await callRoute(createToken, { method: 'POST', params: { workspace: ws.slug }, body: { name: 'notebook' } })).json();
    const bearer = { authorization: `Bearer ${made.token}` };
    expect((await callRoute(v1Studies, { params: {}, headers: bearer })).status).toBe(200);
    await requestResetAction({ email: ws.owner.email });
    const token = await linkFromMail(ws.owner.email, 'reset');
    await completePasswordReset(token, 'a-new-password-now');
    expect((await callRoute(v1Studies, { params: {}, headers: bearer })).status).toBe(401);
  });
});
