// Workspace A with one real row of every kind a /api/w/[workspace]/... URL can name, and an
// unrelated workspace B, for the route-tree isolation tests.
// Every dynamic segment of a route ([study], [plan], [member], …) must map to one of A's rows
// here; tenant-isolation.test.ts fails naming the segment when a new one has no value. The rows
// are real so that a handler which forgets the workspace scope would find them and be caught.
import { POST as storeList } from '@/app/api/w/[workspace]/price-lists/route';
import { POST as createPlan } from '@/app/api/w/[workspace]/promo-plans/route';
import { em } from '@/lib/server/db/orm';
import { authorise } from '@/lib/server/team/membership';
import { createApiToken } from '@/lib/server/team/access-tokens';
import { newToken } from '@/lib/server/platform/tokens';
import { Invitation } from '@/entities/invitation';
import { Purchase } from '@/entities/purchase';
import { demoPriceListCsv } from '@/scripts/seed/demo-price-list';
import { callRoute, makeMember, makeWorkspace, signInAs, uid } from './factories';
import { fitNow, makeSimulatedStudy } from './studies';

export type TenantFixture = Awaited<ReturnType<typeof makeTenantFixture>>;

async function one<T>(sql: string, args: unknown[]): Promise<T> {
  const rows = await (await em()).getConnection().execute<T[]>(sql, args);
  if (!rows[0]) throw new Error(`fixture row missing: ${sql}`);
  return rows[0];
}

export async function makeTenantFixture() {
  const a = await makeWorkspace(`Isolation A ${uid()}`);
  const b = await makeWorkspace(`Isolation B ${uid()}`);
  const viewer = await makeMember(a.slug, 'viewer');
  const analyst = await makeMember(a.slug, 'analyst');
  const ctxA = await authorise(a.owner, a.slug, 'viewer');
  const ctxB = await authorise(b.owner, b.slug, 'viewer');

  const { studyId, workspaceId } = await makeSimulatedStudy(a.slug, { name: `Isolation study ${uid()}` });
  await fitNow(studyId);
  const link = await one<{ id: string }>('select id from respondent_link where study_id = ?', [studyId]);
  const member = await one<{ id: string }>('select id from membership where user_id = ? and workspace_id = ?', [analyst.id, workspaceId]);

  signInAs(a.owner);
  const listRes = await callRoute(storeList, {
    method: 'POST', url: `http://127.0.0.1/x?name=Isolation%20list&currency=EUR`, params: { workspace: a.slug },
    rawBody: demoPriceListCsv(), headers: { 'content-type': 'text/csv' },
  });
  if (listRes.status !== 201) throw new Error(`price list: ${listRes.status} ${await listRes.text()}`);
  const listId = (await listRes.json()).priceList.id as string;
  const planRes = await callRoute(createPlan, { method: 'POST', params: { workspace: a.slug }, body: { name: 'Isolation plan', priceListId: listId, studyId, ending: 'ends-99' } });
  if (planRes.status !== 201) throw new Error(`promo plan: ${planRes.status} ${await planRes.text()}`);
  const planId = (await planRes.json()).plan.id as string;
  signInAs(null);

  const tokenA = await createApiToken(ctxA, 'Isolation A');
  const tokenB = await createApiToken(ctxB, 'Isolation B');

  const db = await em();
  const invitation = db.create(Invitation, { workspace: workspaceId, email: `invitee-${uid()}@test.example`, role: 'analyst', tokenHash: newToken().hash, invitedBy: a.owner.id, expiresAt: new Date(Date.now() + 86_400_000) });
  const sessionId = `cs_test_isolation_${uid()}`;
  db.create(Purchase, { workspace: workspaceId, buyer: a.owner.id, bundle: 'starter', seats: 50, amountCents: 4900, currency: 'EUR', checkoutSessionId: sessionId });
  await db.flush();

  /** Values for each dynamic segment name found under /api/w/[workspace]/... (by folder name). */
  const params: Record<string, string> = {
    workspace: a.slug,
    study: studyId,
    link: link.id,
    list: listId,
    plan: planId,
    token: tokenA.id,
    member: member.id,
    invitation: invitation.id,
    session: sessionId,
    file: 'trials.csv',
  };
  return { a, b, viewer, analyst, workspaceId, studyId, params, tokenA, tokenB };
}

/** How many rows of A's own data exist: unchanged after every refused request. */
export async function countsOf(workspaceId: string) {
  const tables = ['study', 'respondent_link', 'price_list', 'promo_plan', 'api_token', 'membership', 'invitation', 'purchase', 'study_asset'];
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = (await one<{ n: number }>(`select count(*)::int as n from ${t} where workspace_id = ?`, [workspaceId])).n;
  const revoked = await one<{ n: number }>('select count(*)::int as n from api_token where workspace_id = ? and revoked_at is not null', [workspaceId]);
  out.revokedTokens = revoked.n;
  return out;
}
