import { beforeAll, describe, expect, it } from 'vitest';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { POST as statePOST } from '@/app/api/w/[workspace]/studies/[study]/state/route';
import { GET as linksGET, POST as linksPOST } from '@/app/api/w/[workspace]/studies/[study]/links/route';
import { PATCH as linkPATCH } from '@/app/api/w/[workspace]/studies/[study]/links/[link]/route';
import { GET as qrGET } from '@/app/api/w/[workspace]/studies/[study]/links/[link]/qr/route';
import { em } from '@/lib/server/db/orm';
import { RespondentLink } from '@/entities/respondent-link';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';

describe('respondent links', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let study: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
    study = (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign() })).json()).id;
  });
  const p = () => ({ workspace: ws.slug, study });
  const add = (body: unknown) => callRoute(linksPOST, { method: 'POST', params: p(), body });

  it('creates links whose tokens are 32 random bytes in base64url, all different', async () => {
    const made = [];
    for (const source of ['newsletter', 'panel B', 'store QR']) {
      const res = await add({ source, quota: source === 'panel B' ? 150 : '', acceptsPid: source === 'panel B' });
      expect(res.status).toBe(201);
      made.push(await res.json());
    }
    const tokens = made.map((l) => l.url.split('/r/')[1]);
    for (const t of tokens) {
      expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
      expect(Buffer.from(t, 'base64url')).toHaveLength(32);
    }
    expect(new Set(tokens).size).toBe(3);
    // Crude entropy check: 43 base64url characters from a good source rarely repeat much.
    for (const t of tokens) expect(new Set(t).size).toBeGreaterThan(20);
    expect(made[0].url).toMatch(/^https?:\/\/[^/]+\/r\//);
    expect(made[1]).toMatchObject({ source: 'panel B', quota: 150, acceptsPid: true, completes: 0, closedAt: null });
    expect(made[0].quota).toBeNull();
    const list = await (await callRoute(linksGET, { params: p() })).json();
    expect(list.links.map((l: { source: string }) => l.source)).toEqual(['newsletter', 'panel B', 'store QR']);
  });

  it('bad link input is a 422 and nothing is stored', async () => {
    const db = await em();
    const before = await db.count(RespondentLink, { study });
    const res = await add({ source: ' ', quota: 0 });
    expect(res.status).toBe(422);
    expect((await res.json()).error.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['source', 'quota']));
    expect(await db.count(RespondentLink, { study })).toBe(before);
  });

  it('closes a link once (idempotent) and serves its QR code as PNG', async () => {
    const link = await (await add({ source: 'flyer', acceptsPid: false })).json();
    const first = await (await callRoute(linkPATCH, { method: 'PATCH', params: { ...p(), link: link.id }, body: { closed: true } })).json();
    expect(first.closedAt).not.toBeNull();
    const again = await (await callRoute(linkPATCH, { method: 'PATCH', params: { ...p(), link: link.id }, body: { closed: true } })).json();
    expect(again.closedAt).toBe(first.closedAt);
    expect((await callRoute(linkPATCH, { method: 'PATCH', params: { ...p(), link: link.id }, body: { closed: false } })).status).toBe(422);
    const qr = await callRoute(qrGET, { params: { ...p(), link: link.id } });
    expect(qr.status).toBe(200);
    expect(qr.headers.get('content-type')).toBe('image/png');
    const png = new Uint8Array(await qr.arrayBuffer());
    expect([...png.slice(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
    expect((await callRoute(qrGET, { params: { ...p(), link: '00000000-0000-4000-8000-000000000000' } })).status).toBe(404);
  });

  it('a closed study takes no new links', async () => {
    const other = (await (await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign() })).json()).id;
    await callRoute(statePOST, { method: 'POST', params: { workspace: ws.slug, study: other }, body: { action: 'launch' } });
    await callRoute(statePOST, { method: 'POST', params: { workspace: ws.slug, study: other }, body: { action: 'close' } });
    expect((await callRoute(linksPOST, { method: 'POST', params: { workspace: ws.slug, study: other }, body: { source: 'late' } })).status).toBe(409);
  });
});
