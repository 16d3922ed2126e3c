import 'server-only';
import Papa from 'papaparse';
import { Study } from '@/entities/study';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import {
  IMPORT_MAX_BYTES, OPTIONAL_COLUMNS, REQUIRED_COLUMNS, SEGMENT_PREFIX, importRowSchema,
  type ImportRow, type ImportedStudyInput,
} from '@/lib/schemas/import.schema';
import { DEFAULT_CONSENT, StoredDesignError, readDesign, type StudyDesign } from '@/lib/schemas/study.schema';
import { recordAudit } from '@/lib/server/team/audit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { insertFinishedRespondents, type FinishedRespondent } from './finished-respondents';
import { loadStudy } from './studies';

// Response import: parse (papaparse), validate every row (zod), and only when the whole file is
// valid write respondents, trials, the data-version bump and the audit event in one
// transaction, so a failure at any row leaves nothing behind. Errors name their row (header = row 1).

export interface ImportIssue { row: number; message: string }
export interface ImportCheck {
  ok: boolean;
  errors: ImportIssue[];
  preview: Record<string, string>[];
  columns: string[];
  rows: number;
  respondents: number;
  basePrices: number[];
  segmentColumns: string[];
}

const MAX_ERRORS = 500;

export function sizeError() {
  return new AppError(413, 'payload_too_large', `The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB. Split it into smaller files and import them one after another.`);
}

type ValidRow = ImportRow & { segments: Record<string, string> };
interface Parsed { check: ImportCheck; valid: ValidRow[] }

export function checkCsv(text: string, opts: { allowedBasePrices?: number[]; existingRefs?: Set<string> } = {}): Parsed {
  const errors: ImportIssue[] = [];
  const add = (row: number, message: string) => { if (errors.length < MAX_ERRORS) errors.push({ row, message }); };
  const clean = text.replace(/^\uFEFF/, '');
  const empty = (): Parsed => ({ check: { ok: false, errors, preview: [], columns: [], rows: 0, respondents: 0, basePrices: [], segmentColumns: [] }, valid: [] });
  if (!clean.trim()) { add(1, 'The file is empty: it needs a header row (respondent,base_price,discount,response) and at least one data row.'); return empty(); }
  const parsed = Papa.parse<Record<string, string>>(clean, { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim().toLowerCase() });
  const columns = parsed.meta.fields ?? [];
  for (const c of REQUIRED_COLUMNS) if (!columns.includes(c)) add(1, `missing column "${c}" (the header must hold ${REQUIRED_COLUMNS.join(', ')})`);
  const segmentColumns = columns.filter((c) => c.startsWith(SEGMENT_PREFIX));
  for (const c of columns) {
    if ((REQUIRED_COLUMNS as readonly string[]).includes(c) || (OPTIONAL_COLUMNS as readonly string[]).includes(c)) continue;
    if (c.startsWith(SEGMENT_PREFIX) && /^segment_[a-z0-9_]{1,32}$/.test(c)) continue;
    add(1, `unknown column "${c}" (allowed besides the required ones: ${OPTIONAL_COLUMNS.join(', ')}, and segment_<id> for segment answers)`);
  }
  if (new Set(columns).size !== columns.length) add(1, 'a column name appears twice');
  for (const e of parsed.errors) add((e.row ?? 0) + 2, `CSV: ${e.message}`);
  if (errors.length) return { ...empty(), check: { ...empty().check, columns } };
  if (!parsed.data.length) { add(2, 'The file has a header but no data rows.'); return { ...empty(), check: { ...empty().check, columns } }; }

  const valid: Parsed['valid'] = [];
  const segByRespondent = new Map<string, string>();
  const allowed = opts.allowedBasePrices ? new Set(opts.allowedBasePrices.map((p) => p.toFixed(6))) : null;
  parsed.data.forEach((raw, i) => {
    const row = i + 2;
    const r = importRowSchema.safeParse(raw);
    if (!r.success) { for (const iss of r.error.issues) add(row, iss.message); return; }
    const segments: Record<string, string> = Object.fromEntries(segmentColumns.map((c) => [c.slice(SEGMENT_PREFIX.length), (raw[c] ?? '').trim()]).filter(([, v]) => v !== ''));
    if (Object.values(segments).some((v) => v.length > 80)) { add(row, 'a segment answer is longer than 80 characters'); return; }
    const segKey = JSON.stringify(segments);
    const before = segByRespondent.get(r.data.respondent);
    if (before !== undefined && before !== segKey) { add(row, `respondent "${r.data.respondent}" has different segment answers than on an earlier row`); return; }
    segByRespondent.set(r.data.respondent, segKey);
    if (allowed && !allowed.has(r.data.base_price.toFixed(6))) { add(row, `base_price ${r.data.base_price} is not one of this study's base prices (${opts.allowedBasePrices!.join(', ')})`); return; }
    if (opts.existingRefs?.has(r.data.respondent)) { add(row, `respondent "${r.data.respondent}" was already imported into this study`); return; }
    valid.push({ ...r.data, segments });
  });
  const basePrices = [...new Set(valid.map((v) => v.base_price))].sort((a, b) => a - b);
  const check: ImportCheck = {
    ok: errors.length === 0, errors, preview: parsed.data.slice(0, 10), columns, rows: parsed.data.length,
    respondents: segByRespondent.size, basePrices, segmentColumns,
  };
  return { check, valid };
}

async function loadTarget(ctx: WorkspaceContext, studyId: string) {
  const db = await em();
  const s = await loadStudy(db, ctx.workspace.id, studyId);
  if (s.state !== 'closed' && s.state !== 'imported') throw new AppError(409, 'conflict', 'Responses can be imported only into a closed study or one created by an import.');
  const refs = await sql<{ external_ref: string }>(db, 'select external_ref from respondent where study_id = ? and external_ref is not null', [s.id]);
  const basePrices = s.state === 'closed' ? readDesign(s.design, s.state).basePrices : undefined;
  return { db, study: s, existingRefs: new Set(refs.map((r) => r.external_ref)), basePrices };
}

/** Validates (dryRun) or imports a file into an existing closed or imported study. */
export async function importIntoStudy(ctx: WorkspaceContext, studyId: string, text: string, dryRun: boolean) {
  const { db, study, existingRefs, basePrices } = await loadTarget(ctx, studyId);
  const { check, valid } = checkCsv(text, { allowedBasePrices: basePrices, existingRefs });
  if (!check.ok || dryRun) return { check, imported: null };
  await db.transactional(async (tx) => {
    await insertFinishedRespondents(tx, { workspaceId: ctx.workspace.id, studyId: study.id, state: 'imported', respondents: finishedRespondents(valid) });
    // Atomic bump: answers arriving meanwhile bump the same counter.
    await sql(tx, 'update study set data_version = data_version + 1, updated_at = now() where id = ? and workspace_id = ?', [study.id, ctx.workspace.id]);
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.responses_imported', target: study.id, detail: { rows: check.rows, respondents: check.respondents } });
  });
  // The bump bypassed the identity map that this request shares; later reads see it.
  await db.refresh(study);
  return { check, imported: { studyId: study.id, respondents: check.respondents, trials: check.rows } };
}

/** The design of a study made by an import: what the file holds, the builder's defaults for the rest. */
function importedDesign(input: ImportedStudyInput, check: ImportCheck, valid: ValidRow[]): StudyDesign {
  const ladder = [...new Set(valid.filter((v) => v.discount > 0).map((v) => v.discount))];
  const segmentQuestions = check.segmentColumns.map((c) => {
    const id = c.slice(SEGMENT_PREFIX.length);
    return { id, text: id.replace(/_/g, ' '), options: [...new Set(valid.map((v) => v.segments[id]).filter(Boolean))].slice(0, 8) };
  }).filter((q) => q.options.length >= 1);
  const nCatch = valid.filter((v) => v.discount === 0).length;
  try {
    return readDesign({
      ...input, basePrices: check.basePrices, ladder, repetitions: 1, catchShare: Math.min(0.5, nCatch / valid.length), practiceTrials: 0, orderSeed: 0,
      adaptive: { enabled: false }, consentText: DEFAULT_CONSENT, segmentQuestions, attentionCheck: { enabled: false, question: '', options: ['Yes', 'No'], correct: 'Yes' },
      targetCompletes: Math.max(1, check.respondents), priceEnding: 'exact',
    }, 'imported');
  } catch (err) {
    if (err instanceof StoredDesignError) throw new AppError(422, 'validation_failed', 'The file does not make a valid study design; nothing was imported.', err.issues);
    throw err;
  }
}

/** Creates a study of state "imported" from a minimal design and the file, in one transaction. */
export async function importNewStudy(ctx: WorkspaceContext, input: ImportedStudyInput, text: string, dryRun: boolean) {
  const { check, valid } = checkCsv(text);
  if (!check.ok || dryRun) return { check, imported: null };
  const design = importedDesign(input, check, valid);
  const db = await em();
  const studyId = await db.transactional(async (tx) => {
    const now = new Date();
    const study = tx.create(Study, {
      workspace: ctx.workspace.id, name: input.name, state: 'imported', design, exclusionRules: DEFAULT_EXCLUSION_RULES,
      dataVersion: 1, createdBy: ctx.user.id, closedAt: now,
    });
    await tx.flush();
    await insertFinishedRespondents(tx, { workspaceId: ctx.workspace.id, studyId: study.id, state: 'imported', respondents: finishedRespondents(valid) });
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.created_by_import', target: study.id, detail: { rows: check.rows, respondents: check.respondents } });
    return study.id;
  });
  return { check, imported: { studyId, respondents: check.respondents, trials: check.rows } };
}

/** The file's rows grouped by respondent, in file order; trials numbered per respondent from 1. */
function finishedRespondents(valid: ValidRow[]): FinishedRespondent[] {
  const byRef = new Map<string, FinishedRespondent>();
  const now = new Date();
  for (const v of valid) {
    let r = byRef.get(v.respondent);
    if (!r) {
      r = { externalRef: v.respondent, segmentAnswers: v.segments, attentionPassed: null, startedAt: now, completedAt: now, trials: [] };
      byRef.set(v.respondent, r);
    }
    r.trials.push({ idx: r.trials.length + 1, kind: v.discount === 0 ? 'catch' : 'test', basePrice: v.base_price, discount: v.discount, answer: v.response, responseMs: v.response_ms });
  }
  return [...byRef.values()];
}

/** The upload from a multipart form (field "file"), size-checked before and after reading. */
export async function readUpload(req: Request): Promise<{ text: string; fields: Record<string, string> }> {
  const len = Number(req.headers.get('content-length') ?? '0');
  if (len > IMPORT_MAX_BYTES + 64 * 1024) throw sizeError();
  let form: FormData;
  try { form = await req.formData(); } catch { throw new AppError(400, 'bad_request', 'Send the file as multipart/form-data in a field named "file".'); }
  const file = form.get('file');
  if (!(file instanceof Blob)) throw new AppError(400, 'bad_request', 'Choose a CSV file to upload.');
  if (file.size > IMPORT_MAX_BYTES) throw sizeError();
  const fields: Record<string, string> = {};
  form.forEach((v, k) => { if (typeof v === 'string') fields[k] = v; });
  return { text: await file.text(), fields };
}
