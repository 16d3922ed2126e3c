import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { em } from '@/lib/server/db/orm';
import { Workspace } from '@/entities/workspace';
import { addWelcomeSeats, adjustSeats, seatBalance, seatHistory, useSeat, WELCOME_SEATS } from '@/lib/server/billing/seat-ledger';
import { makeWorkspace, uid } from '../support/factories';

// The ledger module is the only writer of seat_ledger_entry; these pin its exactly-once keys.
async function workspaceId(slug: string) {
  return (await (await em()).findOneOrFail(Workspace, { slug })).id;
}

describe('seat ledger: every entry exactly once, the balance its sum', () => {
  it('welcome seats granted again for the same workspace add nothing (a retried sign-up or seed)', async () => {
    const id = await workspaceId((await makeWorkspace()).slug);
    const db = await em();
    expect(await addWelcomeSeats(db, id)).toBe(false);
    expect(await seatBalance(db, id)).toBe(WELCOME_SEATS);
  });

  it('a seat used twice for one respondent is used once; at zero no seat is used', async () => {
    const id = await workspaceId((await makeWorkspace()).slug);
    const db = await em();
    const respondent = randomUUID();
    expect(await useSeat(db, id, respondent)).toBe(true);
    expect(await useSeat(db, id, respondent)).toBe(true);
    expect(await seatBalance(db, id)).toBe(WELCOME_SEATS - 1);
    expect(await adjustSeats(db, id, -(WELCOME_SEATS - 1), `test-${uid()}`)).toBe(true);
    expect(await useSeat(db, id, randomUUID())).toBe(false);
    expect(await seatBalance(db, id)).toBe(0);
  });

  it('the history lists the newest entry first with its reason and signed delta', async () => {
    const id = await workspaceId((await makeWorkspace()).slug);
    const db = await em();
    await adjustSeats(db, id, 7, `test-${uid()}`, 'Goodwill');
    const history = await seatHistory(db, id, 10);
    expect(history.map((e) => [e.reason, e.delta, e.note])).toEqual([['adjustment', 7, 'Goodwill'], ['welcome', WELCOME_SEATS, 'Free seats for a new workspace']]);
    expect(history[0].createdAt).toMatch(/^\d{4}-\d\d-\d\dT/);
    expect(await seatHistory(db, id, 1)).toHaveLength(1);
  });
});
