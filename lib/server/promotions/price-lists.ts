import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { PriceList, type IPriceList } from '@/entities/price-list';
import { PRICE_LIST_MAX_BYTES, priceListMetaSchema, type PriceListMeta } from '@/lib/schemas/price-list.schema';
import { parsePriceList, type ParsedPriceList, type UploadIssue } from '@/lib/promo/parse-price-list';
import type { PlanItem } from '@/lib/promo/floor-table';
import { recordAudit } from '@/lib/server/team/audit';
import { em } from '@/lib/server/db/orm';
import { lockKey } from '@/lib/server/db/sql';
import { insertPriceListItems, readPriceListItems } from './price-list-items';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { requireUuid } from '@/lib/server/platform/ids';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { zodIssues } from '@/lib/server/http/errors';

// Item price lists for promotion plans: an upload is read (multipart field `file`, or a text/csv
// body with ?name=&currency=), validated row by row (lib/promo/parse-price-list.ts) and stored
// all-or-nothing; then listed, read back for plans, and deleted (its plans go with it).
// Refusals: 413 over 8 MB (PRICE_LIST_MAX_BYTES, checked on Content-Length first), 422 with
// issues `rows.<row>.<column>` / `file.<column>` (header = row 1), 409 for a name already used
// in the workspace. The store takes an advisory lock per workspace, so two uploads of one name
// cannot both pass the name check; items go in through the bulk writer (lib/server/db/bulk.ts).
// Tests: tests/integration/price-lists.test.ts.

export interface PriceListDto {
  id: string;
  name: string;
  currency: string;
  itemCount: number;
  createdAt: string;
  createdBy: string | null;
}

const tooLarge = () => new AppError(413, 'payload_too_large', `The file is larger than ${PRICE_LIST_MAX_BYTES / 1024 / 1024} MB. Split the price list into smaller files.`);

/**
 * The CSV text and form fields of an upload: multipart (a `file` field plus `name`, `currency`)
 * or a raw text/csv body with `name` and `currency` in the query string.
 */
export async function readCsvUpload(req: Request): Promise<{ text: string; fields: Record<string, string> }> {
  const declared = Number(req.headers.get('content-length') ?? 0);
  if (declared > PRICE_LIST_MAX_BYTES + 64 * 1024) throw tooLarge();
  const type = req.headers.get('content-type') ?? '';
  const query = Object.fromEntries(new URL(req.url).searchParams);
  if (type.startsWith('multipart/form-data')) {
    let form: FormData;
    try {
      form = await req.formData();
    } catch {
      throw new AppError(400, 'bad_request', 'The upload could not be read as a form.');
    }
    const file = form.get('file');
    if (!file || typeof file === 'string') throw new AppError(422, 'validation_failed', 'Choose a CSV file.', [{ path: 'file', message: 'Choose a CSV file.' }]);
    if (file.size > PRICE_LIST_MAX_BYTES) throw tooLarge();
    const fields: Record<string, string> = { ...query };
    for (const [k, v] of form.entries()) if (typeof v === 'string') fields[k] = v;
    return { text: await file.text(), fields };
  }
  const text = await req.text();
  if (Buffer.byteLength(text) > PRICE_LIST_MAX_BYTES) throw tooLarge();
  return { text, fields: query };
}

export function parseMeta(fields: Record<string, string>): PriceListMeta {
  const r = priceListMetaSchema.safeParse(fields);
  if (!r.success) throw new AppError(422, 'validation_failed', 'Some fields are not valid.', zodIssues(r.error));
  return r.data;
}

/** What the preview step shows: the first rows and every error (up to the listed maximum). */
export function previewDto(p: ParsedPriceList) {
  return { valid: p.errorCount === 0, rowCount: p.rowCount, columns: p.columns, preview: p.preview, errors: p.errors, errorCount: p.errorCount };
}
export type PriceListPreview = ReturnType<typeof previewDto>;

const issuePath = (i: UploadIssue) => (i.row === null ? `file${i.column ? `.${i.column}` : ''}` : `rows.${i.row}${i.column ? `.${i.column}` : ''}`);

/** Stores a valid list in one transaction (multi-row inserts in chunks); nothing on any error. */
export async function createPriceList(ctx: WorkspaceContext, meta: PriceListMeta, text: string): Promise<PriceListDto> {
  const parsed = parsePriceList(text);
  if (parsed.errorCount > 0) {
    throw new AppError(422, 'validation_failed', `The file has ${parsed.errorCount} ${parsed.errorCount === 1 ? 'error' : 'errors'}; nothing was stored.`,
      parsed.errors.map((i) => ({ path: issuePath(i), message: i.row === null ? i.message : `Row ${i.row}: ${i.message}` })));
  }
  const db = await em();
  const id = await db.transactional(async (tx) => {
    // Serialises uploads per workspace so a double-submitted form cannot store the list twice.
    await lockKey(tx, `price_list:${ctx.workspace.id}`);
    if (await tx.count(PriceList, { workspace: ctx.workspace.id, name: meta.name })) {
      throw new AppError(409, 'conflict', `A price list named “${meta.name}” already exists in this workspace.`, [{ path: 'name', message: 'A price list with this name already exists.' }]);
    }
    const list = tx.create(PriceList, { workspace: ctx.workspace.id, name: meta.name, currency: meta.currency, itemCount: parsed.rows.length, createdBy: ctx.user.id });
    await tx.flush();
    await insertPriceListItems(tx, list.id, parsed.rows.map((r) => ({
      row: r.row, sku: r.sku, name: r.name, regularPrice: r.regular_price, unitCost: r.unit_cost, category: r.category,
    })));
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'price_list.uploaded', target: meta.name, detail: { priceListId: list.id, items: parsed.rows.length, currency: meta.currency } });
    return list.id;
  });
  return getPriceList(ctx, id);
}

function toDto(p: IPriceList): PriceListDto {
  return { id: p.id, name: p.name, currency: p.currency, itemCount: p.itemCount, createdAt: p.createdAt.toISOString(), createdBy: p.createdBy?.name ?? null };
}

async function findList(db: EntityManager, ctx: WorkspaceContext, id: string) {
  requireUuid(id, 'That price list');
  const p = await db.findOne(PriceList, { id, workspace: ctx.workspace.id }, { populate: ['createdBy'] });
  if (!p) throw notFoundError('That price list');
  return p;
}

export async function getPriceList(ctx: WorkspaceContext, id: string): Promise<PriceListDto> {
  return toDto(await findList(await em(), ctx, id));
}

export async function listPriceLists(ctx: WorkspaceContext): Promise<PriceListDto[]> {
  const db = await em();
  const rows = await db.find(PriceList, { workspace: ctx.workspace.id }, { populate: ['createdBy'], orderBy: { createdAt: 'desc' } });
  return rows.map(toDto);
}

/** The items of one of the workspace's lists, in file order. */
export async function loadPriceListItems(ctx: WorkspaceContext, id: string): Promise<PlanItem[]> {
  const db = await em();
  await findList(db, ctx, id);
  return readPriceListItems(db, id);
}

export async function deletePriceList(ctx: WorkspaceContext, id: string): Promise<void> {
  const db = await em();
  const p = await findList(db, ctx, id);
  await db.transactional(async (tx) => {
    await tx.nativeDelete(PriceList, { id: p.id, workspace: ctx.workspace.id });
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'price_list.deleted', target: p.name, detail: { priceListId: p.id } });
  });
}
