import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Study, type IStudy } from '@/entities/study';
import { StudyAsset } from '@/entities/study-asset';
import { rulesOrDefault, type ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { readDesign, studyDesignSchema, type StudyDesign, type StudyDesignInput } from '@/lib/schemas/study.schema';
import { isEditable, type StudyStateName } from '@/lib/study-states';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { isUuid } from '@/lib/server/platform/ids';
import { zodIssues } from '@/lib/server/http/errors';
import { recordAudit } from '@/lib/server/team/audit';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Studies in the analyst's workspace: the one study DTO (StudyDetail, shared by the builder,
// the study pages, fieldwork and the analysis), the list, and the draft's create, update,
// duplicate and delete. The design is read through `readDesign`, never cast.

export interface StudyDetail {
  id: string;
  workspaceId: string;
  name: string;
  state: StudyStateName;
  design: StudyDesign;
  /** The rules in force for results and exports (the defaults when never changed). */
  exclusionRules: ExclusionRules;
  /** Bumped whenever the data behind results change; keys cached fits. */
  dataVersion: number;
  copiedFrom: string | null;
  createdAt: string;
  updatedAt: string;
  launchedAt: string | null;
  closedAt: string | null;
}

/** A row of the studies list: a projection of StudyDetail plus the completes counted so far. */
export type StudySummary = Pick<StudyDetail, 'id' | 'name' | 'state' | 'updatedAt'> & Pick<StudyDesign, 'category' | 'task' | 'targetCompletes'> & { completes: number };

export function toDetail(s: IStudy): StudyDetail {
  return {
    id: s.id,
    workspaceId: s.workspace.id,
    name: s.name,
    state: s.state,
    design: readDesign(s.design, s.state),
    exclusionRules: rulesOrDefault(s.exclusionRules),
    dataVersion: s.dataVersion,
    copiedFrom: s.copiedFrom ?? null,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
    launchedAt: s.launchedAt?.toISOString() ?? null,
    closedAt: s.closedAt?.toISOString() ?? null,
  };
}

/** The study with this id in the workspace; a foreign or malformed id is a 404. */
export async function loadStudy(db: EntityManager, workspaceId: string, id: string) {
  const study = isUuid(id) ? await db.findOne(Study, { id, workspace: workspaceId }) : null;
  if (!study) throw notFoundError('That study');
  return study;
}

export async function listStudies(ctx: WorkspaceContext): Promise<StudySummary[]> {
  const db = await em();
  const studies = await db.find(Study, { workspace: ctx.workspace.id }, { orderBy: { updatedAt: 'desc' } });
  const counts = await sql<{ study_id: string; n: string }>(
    db,
    `select study_id, count(*) as n from respondent where workspace_id = ? and state = 'completed' group by study_id`,
    [ctx.workspace.id],
  );
  const completes = new Map(counts.map((r) => [r.study_id, Number(r.n)]));
  return studies.map((s) => {
    const { id, name, state, updatedAt, design } = toDetail(s);
    return { id, name, state, updatedAt, category: design.category, task: design.task, targetCompletes: design.targetCompletes, completes: completes.get(id) ?? 0 };
  });
}

export async function getStudy(ctx: WorkspaceContext, id: string): Promise<StudyDetail> {
  return toDetail(await loadStudy(await em(), ctx.workspace.id, id));
}

/** The picture must be one of this workspace's uploads (ids are guessable only in theory, but scope anyway). */
async function checkPicture(db: EntityManager, ctx: WorkspaceContext, design: StudyDesign) {
  if (!design.itemPictureId) return;
  const n = await db.count(StudyAsset, { id: design.itemPictureId, workspace: ctx.workspace.id });
  if (!n) throw new AppError(422, 'validation_failed', 'Some fields are not valid.', [{ path: 'itemPictureId', message: 'Upload the picture again.' }]);
}

/** Validation on save, whatever the caller checked before: the builder's schema, all its limits. */
function designToSave(input: StudyDesignInput): StudyDesign {
  const parsed = studyDesignSchema.safeParse(input);
  if (!parsed.success) throw new AppError(422, 'validation_failed', 'Some fields are not valid.', zodIssues(parsed.error));
  return parsed.data;
}

export async function createStudy(ctx: WorkspaceContext, input: StudyDesignInput): Promise<StudyDetail> {
  const design = designToSave(input);
  const db = await em();
  await checkPicture(db, ctx, design);
  const study = db.create(Study, { workspace: ctx.workspace.id, name: design.name, design, createdBy: ctx.user.id });
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.created', target: study.name, detail: { studyId: study.id } });
  return toDetail(study);
}

const frozen = () => new AppError(409, 'conflict', 'This study has been launched, so its design is frozen. Duplicate it to make a changed copy.');

export async function updateStudy(ctx: WorkspaceContext, id: string, input: StudyDesignInput): Promise<StudyDetail> {
  const design = designToSave(input);
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, id);
  if (!isEditable(study.state)) throw frozen();
  await checkPicture(db, ctx, design);
  // The state is part of the WHERE so a launch racing this save cannot be overwritten.
  const n = await db.nativeUpdate(Study, { id: study.id, workspace: ctx.workspace.id, state: 'draft' }, { name: design.name, design, updatedAt: new Date() });
  if (!n) throw frozen();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.updated', target: design.name, detail: { studyId: study.id } });
  return toDetail(await db.findOneOrFail(Study, { id: study.id }, { refresh: true }));
}

export async function duplicateStudy(ctx: WorkspaceContext, id: string): Promise<StudyDetail> {
  const db = await em();
  const source = await loadStudy(db, ctx.workspace.id, id);
  const name = `${source.name} (copy)`.slice(0, 160);
  const design = { ...readDesign(source.design, source.state), name };
  const copy = db.create(Study, { workspace: ctx.workspace.id, name, design, copiedFrom: source.id, createdBy: ctx.user.id });
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.duplicated', target: name, detail: { studyId: copy.id, copiedFrom: source.id } });
  return toDetail(copy);
}

export async function deleteStudy(ctx: WorkspaceContext, id: string): Promise<void> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, id);
  if (study.state !== 'draft') throw new AppError(409, 'conflict', 'Only a draft can be deleted; close a launched study instead.');
  const n = await db.nativeDelete(Study, { id: study.id, workspace: ctx.workspace.id, state: 'draft' });
  if (!n) throw new AppError(409, 'conflict', 'Only a draft can be deleted; close a launched study instead.');
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.deleted', target: study.name, detail: { studyId: study.id } });
}
