import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { POST as linksPOST } from '@/app/api/w/[workspace]/studies/[study]/links/route';
import { GET as fieldworkGET } from '@/app/api/w/[workspace]/studies/[study]/fieldwork/route';
import { em } from '@/lib/server/db/orm';
import { Respondent } from '@/entities/respondent';
import { Trial } from '@/entities/trial';
import { Workspace } from '@/entities/workspace';
import { useSeat } from '@/lib/server/billing/seat-ledger';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';

describe('fieldwork numbers from respondent and trial rows', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let study: string;
  let fw: Record<string, unknown> & { cells: number[][]; catchTrials: number[]; offLadder: number[]; perLink: { source: string; completes: number }[] };
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'viewer'));
    const analyst = await makeMember(ws.slug, 'analyst');
    signInAs(analyst);
    study = (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign({ targetCompletes: 40 }) })).json()).id;
    const links = [];
    for (const source of ['newsletter', 'panel B']) links.push(await (await callRoute(linksPOST, { method: 'POST', params: { workspace: ws.slug, study }, body: { source } })).json());

    const db = await em();
    const w = await db.findOneOrFail(Workspace, { slug: ws.slug });
    const old = new Date(Date.now() - 45 * 60_000);
    const person = (link: string, state: 'started' | 'completed', at = new Date()) =>
      db.create(Respondent, { workspace: w.id, study, link, resumeToken: randomUUID(), seed: 1, state, startedAt: at, lastSeenAt: at, completedAt: state === 'completed' ? at : null });
    const done1 = person(links[0].id, 'completed');
    person(links[0].id, 'completed');
    person(links[1].id, 'completed');
    const active = person(links[1].id, 'started');
    const dropped = person(links[0].id, 'started', old);
    await db.flush();
    let idx = 0;
    const trial = (r: typeof done1, kind: 'test' | 'catch' | 'practice', basePrice: number, discount: number, at = new Date()) =>
      db.create(Trial, { study, respondent: r, idx: idx++, kind, basePrice, discount, answer: 1, responseMs: 900, clientId: randomUUID(), answeredAt: at });
    trial(done1, 'test', 2.49, 0.05);
    trial(done1, 'test', 2.49, 0.05);
    trial(done1, 'test', 49, 0.2);
    trial(done1, 'catch', 9.99, 0);
    trial(done1, 'practice', 9.99, 0.1);
    trial(done1, 'test', 9.99, 0.137); // off the ladder, as adaptive placement would give
    trial(active, 'test', 9.99, 0.1);
    trial(dropped, 'test', 2.49, 0.02, old);
    await db.flush();
    // One complete used a seat.
    expect(await useSeat(db, w.id, done1.id)).toBe(true);
    signInAs(await makeMember(ws.slug, 'viewer'));
    const res = await callRoute(fieldworkGET, { params: { workspace: ws.slug, study } });
    expect(res.status).toBe(200);
    fw = await res.json();
  });

  it('counts completes, in progress and drop-outs (no answer for 30 min)', () => {
    expect(fw).toMatchObject({ completes: 3, inProgress: 1, dropOuts: 1, targetCompletes: 40, state: 'draft' });
  });

  it('seats left is the ledger balance', () => {
    expect(fw.seatsLeft).toBe(24);
  });

  it('completes per link', () => {
    expect(fw.perLink.map((l) => [l.source, l.completes])).toEqual([['newsletter', 2], ['panel B', 1]]);
  });

  it('answers per cell: base price rows × rung columns; catch and off-ladder apart; practice left out', () => {
    expect(fw.basePrices).toEqual([2.49, 9.99, 49]);
    expect(fw.ladder).toEqual([0.02, 0.05, 0.1, 0.2]);
    expect(fw.cells).toEqual([
      [1, 2, 0, 0],
      [0, 0, 1, 0],
      [0, 0, 0, 1],
    ]);
    expect(fw.catchTrials).toEqual([0, 1, 0]);
    expect(fw.offLadder).toEqual([0, 1, 0]);
  });
});
