import { beforeAll, describe, expect, it } from 'vitest';
import { Workspace } from '@/entities/workspace';
import { Study } from '@/entities/study';
import { em, withRequestContext } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { changeStudyState } from '@/lib/server/studies/lifecycle';
import { createStudy, getStudy } from '@/lib/server/studies/studies';
import { authorise } from '@/lib/server/team/membership';
import { makeWorkspace } from '../support/factories';
import { validDesign } from '../support/study-fixtures';

// One way to reach the database: inside a request (route, action, job) every em() is the same
// EntityManager, so one identity map and one transaction serve the whole request; outside one
// (scripts, tests) each call forks its own. These checks protect that, the sql() helper's
// joining of the transaction, and reads after a native update within one request.

describe('the request-scoped EntityManager', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => {
    ws = await makeWorkspace();
  });

  it('two em() calls within one withRequestContext share the EntityManager and its identity map', async () => {
    const [a, b, wa, wb] = await withRequestContext(async () => {
      const first = await em();
      const second = await em();
      return [first, second, await first.findOneOrFail(Workspace, { slug: ws.slug }), await second.findOneOrFail(Workspace, { slug: ws.slug })] as const;
    });
    expect(a).toBe(b);
    expect(wa).toBe(wb);
  });

  it('two em() calls outside any request context fork two EntityManagers, as do two requests', async () => {
    const a = await em();
    const b = await em();
    expect(a).not.toBe(b);
    expect(await a.findOneOrFail(Workspace, { slug: ws.slug })).not.toBe(await b.findOneOrFail(Workspace, { slug: ws.slug }));
    const first = await withRequestContext(() => em());
    const second = await withRequestContext(() => em());
    expect(first).not.toBe(second);
  });

  it('sql() joins the transaction it is given: a rolled-back transaction leaves no raw change behind', async () => {
    const db = await em();
    const { id } = await db.findOneOrFail(Workspace, { slug: ws.slug });
    await expect(db.transactional(async (tx) => {
      await sql(tx, 'update workspace set name = ? where id = ?', ['Renamed inside', id]);
      expect((await sqlOne<{ name: string }>(tx, 'select name from workspace where id = ?', [id]))?.name).toBe('Renamed inside');
      throw new Error('roll back');
    })).rejects.toThrow('roll back');
    expect((await sqlOne<{ name: string }>(db, 'select name from workspace where id = ?', [id]))?.name).not.toBe('Renamed inside');
  });

  it('within one request, a study read after a native state change shows the new state, not the cached one', async () => {
    await withRequestContext(async () => {
      const ctx = await authorise(ws.owner, ws.slug, 'analyst');
      const draft = await createStudy(ctx, validDesign());
      expect((await getStudy(ctx, draft.id)).state).toBe('draft');
      const cached = await (await em()).findOneOrFail(Study, { id: draft.id });
      await changeStudyState(ctx, draft.id, 'launch');
      expect((await getStudy(ctx, draft.id)).state).toBe('live');
      expect(cached.state).toBe('live');
    });
  });
});
