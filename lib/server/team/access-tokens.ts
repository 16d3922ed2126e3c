import 'server-only';
import { ApiToken, type IApiToken } from '@/entities/api-token';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { requireUuid } from '@/lib/server/platform/ids';
import { hashToken, randomToken } from '@/lib/server/platform/tokens';
import { authorise, type WorkspaceContext } from './membership';

// Personal access tokens for the read-only export API (/api/v1). The token is shown once; only
// its SHA-256 hash is stored (a 256-bit random token needs no slow hash), with a short prefix
// so its owner can tell tokens apart. A token acts for its user in its one workspace, as a
// viewer, and only while the user is still a member — decided by the same `authorise` that
// guards a session, so a token can never reach what its user could not.

const PREFIX_LENGTH = 11;

export interface ApiTokenDto { id: string; name: string; prefix: string; createdAt: string; lastUsedAt: string | null; revokedAt: string | null }

const toDto = (t: Pick<IApiToken, 'id' | 'name' | 'prefix' | 'createdAt' | 'lastUsedAt' | 'revokedAt'>): ApiTokenDto => ({
  id: t.id, name: t.name, prefix: t.prefix, createdAt: t.createdAt.toISOString(),
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null, revokedAt: t.revokedAt?.toISOString() ?? null,
});

export async function listApiTokens(ctx: WorkspaceContext): Promise<ApiTokenDto[]> {
  const db = await em();
  const rows = await db.find(ApiToken, { workspace: ctx.workspace.id, user: ctx.user.id }, { orderBy: { createdAt: 'desc' } });
  return rows.map(toDto);
}

export async function createApiToken(ctx: WorkspaceContext, name: string): Promise<ApiTokenDto & { token: string }> {
  const db = await em();
  const token = `nw_${randomToken()}`;
  const row = db.create(ApiToken, { workspace: ctx.workspace.id, user: ctx.user.id, name, tokenHash: hashToken(token), prefix: token.slice(0, PREFIX_LENGTH) });
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'api_token.created', target: row.prefix, detail: { name } });
  return { ...toDto(row), token };
}

/** Revokes one of the user's own tokens (owners may revoke any token of the workspace). Idempotent. */
export async function revokeApiToken(ctx: WorkspaceContext, id: string): Promise<ApiTokenDto> {
  requireUuid(id, 'That token');
  const db = await em();
  const where = ctx.role === 'owner' ? { id, workspace: ctx.workspace.id } : { id, workspace: ctx.workspace.id, user: ctx.user.id };
  const row = await db.findOne(ApiToken, where);
  if (!row) throw notFoundError('That token');
  if (!row.revokedAt) {
    row.revokedAt = new Date();
    await db.flush();
    await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'api_token.revoked', target: row.prefix });
  }
  return toDto(row);
}

const unauthorised = () => new AppError(401, 'unauthenticated', 'Send a valid access token: Authorization: Bearer <token>.', undefined, { 'www-authenticate': 'Bearer' });

/**
 * The workspace context a bearer token grants: the token names a user and a workspace, and the
 * session guard decides as for a signed-in viewer. Any refusal is a 401 (the caller holds a
 * token, not a session, so "sign in" or "not found" would mislead).
 */
export async function authenticateToken(req: Request): Promise<WorkspaceContext> {
  const m = /^Bearer\s+(\S+)\s*$/i.exec(req.headers.get('authorization') ?? '');
  if (!m) throw unauthorised();
  const db = await em();
  const row = await db.findOne(ApiToken, { tokenHash: hashToken(m[1]), revokedAt: null }, { populate: ['workspace', 'user'] });
  if (!row) throw unauthorised();
  const user = { id: row.user.id, email: row.user.email, name: row.user.name };
  const ctx = await authorise(user, row.workspace.slug, 'viewer').catch((err: unknown) => {
    throw err instanceof AppError ? unauthorised() : err;
  });
  // Coarse on purpose: one write per token per minute at most.
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
    await db.nativeUpdate(ApiToken, { id: row.id }, { lastUsedAt: new Date() });
  }
  // A token reads; whatever the user's own role, it acts as a viewer.
  return { ...ctx, role: 'viewer' };
}
