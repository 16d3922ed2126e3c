import { describe, expect, it } from 'vitest';
import { GET as billingGET } from '@/app/api/w/[workspace]/billing/route';
import { Respondent } from '@/entities/respondent';
import { em } from '@/lib/server/db/orm';
import { useSeat as spendSeat, creditPurchase } from '@/lib/server/billing/seat-ledger';
import { Purchase } from '@/entities/purchase';
import { receiptNumber } from '@/lib/server/billing/receipt-number';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { makeSimulatedStudy } from '../support/studies';

// Billing's ledger says, for each complete, which study it belongs to and whether the respondent
// is kept or excluded by that study's rules: an excluded complete still used a seat.

describe('the seat ledger shows excluded completes as such', () => {
  it('names the study and the rule that excludes a complete; kept completes say so', async () => {
    const ws = await makeWorkspace();
    const { studyId, workspaceId } = await makeSimulatedStudy(ws.slug, { name: 'Ledger study', sim: { respondents: 6, careless: { inattentive: 2, speeders: 0, straightLiners: 0 } } });
    const db = await em();
    const people = await db.find(Respondent, { study: studyId }, { orderBy: { seed: 'asc' } });
    for (const p of people) expect(await spendSeat(db, workspaceId, p.id)).toBe(true);
    signInAs(ws.owner);
    const res = await callRoute(billingGET, { params: { workspace: ws.slug } });
    expect(res.status).toBe(200);
    const body = await res.json() as { entries: { reason: string; reference: string; complete: { studyName: string; excludedBy: string[] } | null }[] };
    const completes = body.entries.filter((e) => e.reason === 'complete');
    expect(completes).toHaveLength(6);
    expect(completes.every((e) => e.complete?.studyName === 'Ledger study')).toBe(true);
    const failed = new Set(people.filter((p) => p.attentionPassed === false).map((p) => p.id));
    expect(failed.size).toBe(2);
    for (const e of completes) {
      expect(e.complete!.excludedBy).toEqual(failed.has(e.reference) ? ['Failed the attention check'] : []);
    }
    // Other lines keep their plain reference.
    expect(body.entries.find((e) => e.reason === 'welcome')?.complete).toBeNull();
  });

  it('names a paid purchase by its receipt number and bundle, and another workspace’s purchase not at all', async () => {
    const ws = await makeWorkspace();
    const other = await makeWorkspace();
    const db = await em();
    const paidAt = new Date('2026-05-04T10:00:00Z');
    const mine = db.create(Purchase, { workspace: ws.workspaceId, bundle: 'pilot', seats: 100, amountCents: 9000, currency: 'eur', checkoutSessionId: `cs_test_${ws.slug}`, status: 'paid', paidAt });
    const theirs = db.create(Purchase, { workspace: other.workspaceId, bundle: 'study', seats: 500, amountCents: 40000, currency: 'eur', checkoutSessionId: `cs_test_${other.slug}`, status: 'paid', paidAt });
    await db.flush();
    await creditPurchase(db, { workspaceId: ws.workspaceId, seats: 100, checkoutSessionId: mine.checkoutSessionId, note: 'Pilot bundle' });
    // A ledger line of this workspace that points at the other workspace's session must not reveal it.
    await creditPurchase(db, { workspaceId: ws.workspaceId, seats: 1, checkoutSessionId: theirs.checkoutSessionId, note: 'Mis-keyed' });
    signInAs(ws.owner);
    const body = await (await callRoute(billingGET, { params: { workspace: ws.slug } })).json() as { entries: { reason: string; delta: number; purchase: { receipt: string | null; bundle: string } | null }[] };
    const lines = body.entries.filter((e) => e.reason === 'purchase');
    expect(lines.find((e) => e.delta === 100)?.purchase).toMatchObject({ receipt: receiptNumber(mine.id, paidAt), bundle: 'Pilot' });
    expect(lines.find((e) => e.delta === 1)?.purchase).toBeNull();
  });
});
