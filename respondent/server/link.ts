import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { readDesign, type Language, type StudyDesign } from '@/lib/schemas/study.schema';
import { sqlOne } from '@/lib/server/db/sql';
import { refusal, type RespondentError } from './words';

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

/**
 * Why a link cannot take respondents: 404 unknown, 410 closed or not (or no longer) live; in
 * the study's language, or `unknownLanguage` (the browser's) when no study stands behind it.
 */
export function linkRefusal(link: RespondentLinkWithStudy | null, unknownLanguage: Language = 'en'): RespondentError | null {
  if (!link || link.studyState === 'imported') return refusal(unknownLanguage, 404, 'not_found', 'unknownLink');
  return stoppedRefusal(link.studyState, link.closed, link.design.language);
}

/**
 * The 410 of a link whose study is not live or which is closed, or null. One rule for everyone:
 * /state, the answers and the complete of a respondent already in progress refuse exactly when
 * the link's entry does (a paused study or a closed link stops the answers in progress too; the
 * phone keeps what it has not sent, and a resume after the study is resumed sends it).
 */
export function stoppedRefusal(studyState: string, linkClosed: boolean, language: Language): RespondentError | null {
  if (studyState === 'closed') return refusal(language, 410, 'gone', 'closed');
  if (linkClosed) return refusal(language, 410, 'gone', 'linkClosed');
  if (studyState === 'paused') return refusal(language, 410, 'gone', 'paused');
  if (studyState !== 'live') return refusal(language, 410, 'gone', 'notOpen');
  return null;
}

export async function openLink(db: EntityManager, token: string, unknownLanguage: Language = 'en'): Promise<RespondentLinkWithStudy> {
  const link = await loadLink(db, token);
  const refused = linkRefusal(link, unknownLanguage);
  if (refused) throw refused;
  return link!;
}

export const resumeCookieName = (studyId: string) => `nw_r_${studyId}`;
