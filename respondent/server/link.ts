import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { readDesign, type StudyDesign } from '@/lib/schemas/study.schema';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';

/** A respondent link as the respondent side sees it: the link with its study's state, design and retention. */
export interface RespondentLinkWithStudy {
  token: string;
  linkId: string;
  studyId: string;
  workspaceId: string;
  studyState: string;
  closed: boolean;
  quota: number | null;
  acceptsPid: boolean;
  /** The key panel ids must be signed with, or null (respondent/server/panel-ids.ts). */
  pidSecret: string | null;
  design: StudyDesign;
  /** Frozen in the study at launch (what the consent screen promises); the workspace's setting before that. */
  retentionDays: number;
}

/** A respondent link with its study and workspace facts, one query; null when unknown. */
export async function loadLink(db: EntityManager, token: string): Promise<RespondentLinkWithStudy | null> {
  if (!/^[A-Za-z0-9_-]{8,64}$/.test(token)) return null;
  const r = await sqlOne(
    db,
    `select l.id as link_id, l.closed_at, l.quota, l.accepts_pid, l.pid_secret, s.id as study_id, s.state, s.design, s.workspace_id,
            coalesce(s.retention_days, w.retention_days) as retention_days
       from respondent_link l join study s on s.id = l.study_id join workspace w on w.id = s.workspace_id
      where l.token = ?`,
    [token],
  );
  if (!r) return null;
  return {
    token,
    linkId: String(r.link_id),
    studyId: String(r.study_id),
    workspaceId: String(r.workspace_id),
    studyState: String(r.state),
    closed: r.closed_at != null,
    quota: r.quota == null ? null : Number(r.quota),
    acceptsPid: Boolean(r.accepts_pid),
    pidSecret: (r.pid_secret as string | null) ?? null,
    design: readDesign(r.design, String(r.state)),
    retentionDays: Number(r.retention_days),
  };
}

/** Why a link cannot take respondents: 404 unknown, 410 closed or not (or no longer) live. */
export function linkRefusal(link: RespondentLinkWithStudy | null): AppError | null {
  if (!link || link.studyState === 'imported') return new AppError(404, 'not_found', 'This link does not lead to a study. Check the address you were given.');
  return stoppedRefusal(link.studyState, link.closed);
}

/**
 * The 410 of a link whose study is not live or which is closed, or null. One rule for everyone:
 * /state, the answers and the complete of a respondent already in progress refuse exactly when
 * the link's entry does (a paused study or a closed link stops the answers in progress too; the
 * phone keeps what it has not sent, and a resume after the study is resumed sends it).
 */
export function stoppedRefusal(studyState: string, linkClosed: boolean): AppError | null {
  if (studyState === 'closed') return new AppError(410, 'gone', 'This study is closed. Thank you for your interest.');
  if (linkClosed) return new AppError(410, 'gone', 'This link is closed. Thank you for your interest.');
  if (studyState === 'paused') return new AppError(410, 'gone', 'This study is paused at the moment. Please try again later.');
  if (studyState !== 'live') return new AppError(410, 'gone', 'This study is not open. Thank you for your interest.');
  return null;
}

export async function openLink(db: EntityManager, token: string): Promise<RespondentLinkWithStudy> {
  const link = await loadLink(db, token);
  const refusal = linkRefusal(link);
  if (refusal) throw refusal;
  return link!;
}

export const resumeCookieName = (studyId: string) => `nw_r_${studyId}`;
