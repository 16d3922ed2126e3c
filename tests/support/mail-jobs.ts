// Account e-mails go out from the `mail` job queue (lib/server/team/account-mail.ts), and the
// integration tier runs no worker: these helpers do the worker's part. Any test may deliver any
// queued mail (the queue is shared by files running at once); each then waits for its own
// address in maildev.
import { boss, MAIL_QUEUE } from '@/lib/server/platform/jobs';
import { runAccountMailJob, type AccountMailJob } from '@/lib/server/team/account-mail';
import { withRequestContext } from '@/lib/server/db/orm';
import { mailsTo, waitForMail, type CaughtMail } from './stand-ins';

/** Sends every queued account e-mail now, as the worker would; returns how many ran. */
export async function deliverQueuedMail(): Promise<number> {
  const b = await boss();
  let ran = 0;
  for (;;) {
    const jobs = await b.fetch<AccountMailJob>(MAIL_QUEUE, { batchSize: 20 });
    if (!jobs.length) return ran;
    for (const job of jobs) {
      try {
        await withRequestContext(() => runAccountMailJob(job.data));
        await b.complete(MAIL_QUEUE, job.id);
        ran++;
      } catch (err) {
        await b.fail(MAIL_QUEUE, job.id, { message: String(err) });
      }
    }
  }
}

/** Delivers queued mail, then waits for `count` messages to `address`. */
export async function deliverAndWait(address: string, count = 1, timeoutMs = 10_000): Promise<CaughtMail[]> {
  await deliverQueuedMail();
  return waitForMail(address, count, timeoutMs);
}

/**
 * The token of the newest `kind` link (`/confirm/…`, `/reset/…`, `/invite/…`) mailed to
 * `address`, once at least `count` such mails arrived. Other mails to the address are ignored
 * (a confirmation job run by another file may land beside a reset).
 */
export async function linkFromMail(address: string, kind: 'confirm' | 'reset' | 'invite', count = 1, timeoutMs = 10_000): Promise<string> {
  const until = Date.now() + timeoutMs;
  const pattern = new RegExp(`/${kind}/([\\w-]+)`);
  for (;;) {
    await deliverQueuedMail();
    const links = (await mailsTo(address)).map((m) => pattern.exec(m.text)?.[1]).filter((t): t is string => !!t);
    if (links.length >= count) return links.at(-1)!;
    if (Date.now() > until) throw new Error(`no ${kind} link mailed to ${address}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
