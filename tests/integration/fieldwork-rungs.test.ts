import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { GET as fieldworkGET } from '@/app/api/w/[workspace]/studies/[study]/fieldwork/route';
import { em } from '@/lib/server/db/orm';
import { Respondent } from '@/entities/respondent';
import { Trial } from '@/entities/trial';
import { Workspace } from '@/entities/workspace';
import { shownDiscount, shownPrice } from '@/respondent/shared/price';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';

// The fieldwork monitor groups answers by the rung they were drawn from (Trial.shown.rung), not
// by the rounded discount shown, and reports the discount shoppers actually saw per cell.

describe('fieldwork cells by the rung drawn', () => {
  it('answers at rounded prices land in their rung, with the discount shown beside the count', async () => {
    const ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
    const body = validDesign({ basePrices: [2.49, 12.9], ladder: [0.03, 0.06, 0.12], priceEnding: 'exact' });
    const study = (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body })).json()).id as string;
    const db = await em();
    const w = await db.findOneOrFail(Workspace, { slug: ws.slug });
    const r = db.create(Respondent, { workspace: w.id, study, resumeToken: randomUUID(), seed: 1, state: 'completed', startedAt: new Date(), lastSeenAt: new Date(), completedAt: new Date() });
    await db.flush();
    let idx = 0;
    for (const base of [2.49, 12.9]) {
      for (const rung of [0.03, 0.06, 0.12]) {
        const price = shownPrice(base, rung, 'exact');
        for (let k = 0; k < 2; k++) {
          db.create(Trial, { study, respondent: r, idx: idx++, kind: 'test', basePrice: base, discount: shownDiscount(base, price), shown: { price, rung }, answer: 1, responseMs: 900, clientId: randomUUID() });
        }
      }
    }
    // An imported row carries no shown.rung: its discount is the nominal depth.
    db.create(Trial, { study, respondent: r, idx: idx++, kind: 'test', basePrice: 12.9, discount: 0.12, shown: null, answer: 0, responseMs: 0, clientId: randomUUID() });
    await db.flush();
    // 3 % of 2.49 shows 2.81 %: with grouping by discount every answer there was "off ladder".
    expect(shownDiscount(2.49, shownPrice(2.49, 0.03, 'exact'))).not.toBe(0.03);
    const fw = await (await callRoute(fieldworkGET, { params: { workspace: ws.slug, study } })).json();
    expect(fw.cells).toEqual([[2, 2, 2], [2, 2, 3]]);
    expect(fw.offLadder).toEqual([0, 0]);
    expect(fw.shown[0][0]).toBeCloseTo(shownDiscount(2.49, 2.42), 6);
    expect(fw.shown[1][2]).toBeCloseTo((2 * shownDiscount(12.9, shownPrice(12.9, 0.12, 'exact')) + 0.12) / 3, 6);
  });
});
