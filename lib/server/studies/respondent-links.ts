import 'server-only';
import { RespondentLink } from '@/entities/respondent-link';
import type { z } from 'zod';
import type { respondentLinkSchema } from '@/lib/schemas/respondent-link.schema';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { env } from '@/lib/server/platform/env';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { recordAudit } from '@/lib/server/team/audit';
import { isUuid } from '@/lib/server/platform/ids';
import { loadStudy } from './studies';
import { randomToken } from '@/lib/server/platform/tokens';
import { hasRole } from '@/lib/roles';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Respondent links of a study, one per source ("newsletter", "panel B", "store QR"): the token is
// 32 random bytes, base64url (unguessable, so a link is its own permission), and the URL is
// APP_URL/r/<token>. A closed or imported study takes no new link (409). Closing a link is
// one-way and idempotent (the first closing time stays); a closed link turns respondents away
// with 410 on the respondent side. A link that passes panel ids may ask the panel to sign them
// (pidSecret, 32 random bytes; shown to analysts only): respondent/server/panel-ids.ts says why.
// Tests: tests/integration/studies-links.test.ts, tests/integration/respondent-data-protection.test.ts.

export interface RespondentLinkDto {
  id: string;
  source: string;
  url: string;
  quota: number | null;
  acceptsPid: boolean;
  /** The key the panel signs ids with (&sig= = hex HMAC-SHA-256(key, pid)); analysts only; null when ids are not signed. */
  pidSecret: string | null;
  completes: number;
  started: number;
  closedAt: string | null;
  createdAt: string;
}

/** 32 random bytes, base64url: 256 bits, far beyond guessing. */
export const newLinkToken = randomToken;
export const linkUrl = (token: string) => `${env().APP_URL.replace(/\/$/, '')}/r/${token}`;

function toDto(l: { id: string; source: string; token: string; quota?: number | null; acceptsPid: boolean; pidSecret?: string | null; closedAt?: Date | null; createdAt: Date }, counts?: { completes: number; started: number }, showSecret = false): RespondentLinkDto {
  return {
    id: l.id,
    source: l.source,
    url: linkUrl(l.token),
    quota: l.quota ?? null,
    acceptsPid: l.acceptsPid,
    pidSecret: showSecret ? l.pidSecret ?? null : null,
    completes: counts?.completes ?? 0,
    started: counts?.started ?? 0,
    closedAt: l.closedAt?.toISOString() ?? null,
    createdAt: l.createdAt.toISOString(),
  };
}

export async function listLinks(ctx: WorkspaceContext, studyId: string): Promise<RespondentLinkDto[]> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, studyId);
  const links = await db.find(RespondentLink, { study: study.id, workspace: ctx.workspace.id }, { orderBy: { createdAt: 'asc' } });
  const rows = await sql<{ link_id: string; completes: string; started: string }>(
    db,
    `select link_id, count(*) filter (where state = 'completed') as completes, count(*) as started
       from respondent where study_id = ? and workspace_id = ? and link_id is not null group by link_id`,
    [study.id, ctx.workspace.id],
  );
  const counts = new Map(rows.map((r) => [r.link_id, { completes: Number(r.completes), started: Number(r.started) }]));
  return links.map((l) => toDto(l, counts.get(l.id), hasRole(ctx.role, 'analyst')));
}

export async function createLink(ctx: WorkspaceContext, studyId: string, input: z.output<typeof respondentLinkSchema>): Promise<RespondentLinkDto> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, studyId);
  if (study.state === 'closed' || study.state === 'imported') throw new AppError(409, 'conflict', 'This study is closed; it takes no new links.');
  const link = db.create(RespondentLink, { workspace: ctx.workspace.id, study: study.id, token: newLinkToken(), source: input.source, quota: input.quota, acceptsPid: input.acceptsPid,
    pidSecret: input.acceptsPid && input.signsPid ? randomToken() : null });
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'link.created', target: `${study.name} · ${input.source}`, detail: { studyId: study.id, linkId: link.id } });
  return toDto(link, undefined, true);
}

async function loadLink(ctx: WorkspaceContext, studyId: string, linkId: string) {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, studyId);
  const link = isUuid(linkId) ? await db.findOne(RespondentLink, { id: linkId, study: study.id, workspace: ctx.workspace.id }) : null;
  if (!link) throw notFoundError('That link');
  return { db, study, link };
}

/** Closing is one-way and idempotent: closing a closed link keeps its first closing time. */
export async function closeLink(ctx: WorkspaceContext, studyId: string, linkId: string): Promise<RespondentLinkDto> {
  const { db, study, link } = await loadLink(ctx, studyId, linkId);
  if (!link.closedAt) {
    link.closedAt = new Date();
    await db.flush();
    await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'link.closed', target: `${study.name} · ${link.source}`, detail: { studyId: study.id, linkId: link.id } });
  }
  return toDto(link);
}

export async function linkUrlFor(ctx: WorkspaceContext, studyId: string, linkId: string): Promise<string> {
  const { link } = await loadLink(ctx, studyId, linkId);
  return linkUrl(link.token);
}
