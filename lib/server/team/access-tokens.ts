import 'server-only';
import type { NextRequest } from 'next/server';
import { ApiToken, type IApiToken } from '@/entities/api-token';
import { Membership } from '@/entities/membership';
import { hasRole } from '@/lib/roles';
import { toErrorResponse } from '@/lib/server/http/route';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { requireUuid } from '@/lib/server/platform/ids';
import { hashToken, randomToken } from '@/lib/server/platform/tokens';
import type { WorkspaceContext } from './membership';

// Personal access tokens for the read-only export API (/api/v1). The token is shown once; only
// its SHA-256 hash is stored (a 256-bit random token needs no slow hash), with a short prefix
// so its owner can tell tokens apart. A token acts for its user in its one workspace, as a
// viewer, and only while the user is still a member.

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

/** The workspace context a bearer token grants (viewer rights), or a 401. */
export async function authenticateToken(req: Request): Promise<WorkspaceContext> {
  const m = /^Bearer\s+(\S+)\s*$/i.exec(req.headers.get('authorization') ?? '');
  if (!m) throw unauthorised();
  const db = await em();
  const row = await db.findOne(ApiToken, { tokenHash: hashToken(m[1]), revokedAt: null }, { populate: ['workspace', 'user'] });
  if (!row) throw unauthorised();
  const member = await db.findOne(Membership, { user: row.user.id, workspace: row.workspace.id });
  if (!member || !hasRole(member.role, 'viewer')) throw unauthorised();
  // Coarse on purpose: one write per token per minute at most.
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
    await db.nativeUpdate(ApiToken, { id: row.id }, { lastUsedAt: new Date() });
  }
  return {
    user: { id: row.user.id, email: row.user.email, name: row.user.name },
    workspace: { id: row.workspace.id, slug: row.workspace.slug, name: row.workspace.name },
    role: 'viewer',
  };
}

/** A GET route handler of the token API. */
export function tokenRoute<P extends Record<string, string>>(handler: (req: NextRequest, ctx: WorkspaceContext, params: P) => Promise<Response>) {
  return async (req: NextRequest, route: { params: Promise<P> }) => {
    try {
      const ctx = await authenticateToken(req);
      return await handler(req, ctx, await route.params);
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}
