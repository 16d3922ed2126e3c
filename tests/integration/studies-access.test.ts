import { beforeAll, describe, expect, it } from 'vitest';
import type { NextRequest } from 'next/server';
import * as studies from '@/app/api/w/[workspace]/studies/route';
import * as one from '@/app/api/w/[workspace]/studies/[study]/route';
import * as state from '@/app/api/w/[workspace]/studies/[study]/state/route';
import * as dup from '@/app/api/w/[workspace]/studies/[study]/duplicate/route';
import * as links from '@/app/api/w/[workspace]/studies/[study]/links/route';
import * as link from '@/app/api/w/[workspace]/studies/[study]/links/[link]/route';
import * as qr from '@/app/api/w/[workspace]/studies/[study]/links/[link]/qr/route';
import * as fieldwork from '@/app/api/w/[workspace]/studies/[study]/fieldwork/route';
import * as assets from '@/app/api/w/[workspace]/assets/route';
import { em } from '@/lib/server/db/orm';
import { Study } from '@/entities/study';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { validDesign } from '../support/study-fixtures';

type Handler = (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

describe('study routes: a foreign member gets 404, a viewer 403 on every change', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let outsider: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  let linkId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    outsider = await makeWorkspace();
    signInAs(ws.owner);
    studyId = (await (await callRoute(studies.POST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign() })).json()).id;
    linkId = (await (await callRoute(links.POST, { method: 'POST', params: { workspace: ws.slug, study: studyId }, body: { source: 'newsletter' } })).json()).id;
  });

  const mutating = (): [string, Handler, string, Record<string, string>, unknown][] => [
    ['create study', studies.POST as Handler, 'POST', {}, validDesign({ name: 'Sneaked in' })],
    ['edit draft', one.PATCH as Handler, 'PATCH', { study: studyId }, validDesign({ name: 'Sneaked in' })],
    ['delete draft', one.DELETE as Handler, 'DELETE', { study: studyId }, undefined],
    ['launch', state.POST as Handler, 'POST', { study: studyId }, { action: 'launch' }],
    ['duplicate', dup.POST as Handler, 'POST', { study: studyId }, undefined],
    ['add link', links.POST as Handler, 'POST', { study: studyId }, { source: 'sneaky' }],
    ['close link', link.PATCH as Handler, 'PATCH', { study: studyId, link: linkId }, { closed: true }],
    ['upload picture', assets.POST as Handler, 'POST', {}, undefined],
  ];
  const reads = (): [string, Handler, Record<string, string>][] => [
    ['list', studies.GET as Handler, {}],
    ['study', one.GET as Handler, { study: studyId }],
    ['links', links.GET as Handler, { study: studyId }],
    ['qr', qr.GET as Handler, { study: studyId, link: linkId }],
    ['fieldwork', fieldwork.GET as Handler, { study: studyId }],
  ];

  it('a member of another workspace: 404 on every route, reads included', async () => {
    signInAs(outsider.owner);
    for (const [name, h, method, params, body] of mutating()) {
      const res = await callRoute(h, { method, params: { workspace: ws.slug, ...params }, body });
      expect(res.status, name).toBe(404);
    }
    for (const [name, h, params] of reads()) expect((await callRoute(h, { params: { workspace: ws.slug, ...params } })).status, name).toBe(404);
  });

  it('the outsider cannot reach the study through their own workspace either (scoped by workspace id)', async () => {
    signInAs(outsider.owner);
    for (const [name, h, params] of reads().slice(1)) expect((await callRoute(h, { params: { workspace: outsider.slug, ...params } })).status, name).toBe(404);
    const res = await callRoute(one.PATCH as Handler, { method: 'PATCH', params: { workspace: outsider.slug, study: studyId }, body: validDesign({ name: 'Sneaked in' }) });
    expect(res.status).toBe(404);
  });

  it('a viewer reads everything but every change is a 403', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    for (const [name, h, params] of reads()) expect((await callRoute(h, { params: { workspace: ws.slug, ...params } })).status, name).toBe(200);
    for (const [name, h, method, params, body] of mutating()) {
      const res = await callRoute(h, { method, params: { workspace: ws.slug, ...params }, body });
      expect(res.status, name).toBe(403);
    }
  });

  it('nothing changed', async () => {
    const db = await em();
    const s = await db.findOneOrFail(Study, { id: studyId });
    expect(s).toMatchObject({ name: 'Olive oil thresholds', state: 'draft' });
    expect(await db.count(Study, { name: 'Sneaked in' })).toBe(0);
  });
});
