import 'server-only';
import { recordCsv, recordJson } from '@/lib/record/export';
import { AppError } from '@/lib/server/http/errors';
import { csvFile, jsonFile, type FileDownload } from '@/lib/server/http/download';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { listRecord, uncoveredCategories } from './record';

// The record's files for the signed-in download and the token API (/api/v1/record): the same
// bytes from the same function. Reads cached fits only; queues nothing.

export const RECORD_FORMATS = ['csv', 'json'] as const;
export type RecordFormat = (typeof RECORD_FORMATS)[number];

export function parseRecordFormat(v: string | null): RecordFormat {
  if (v === null || v === '') return 'json';
  if ((RECORD_FORMATS as readonly string[]).includes(v)) return v as RecordFormat;
  throw new AppError(422, 'validation_failed', 'format must be csv or json.', [{ path: 'format', message: 'Use csv or json.' }]);
}

export async function recordDownload(ctx: WorkspaceContext, format: RecordFormat): Promise<FileDownload> {
  const entries = await listRecord(ctx);
  const name = `${ctx.workspace.slug}-threshold-record`;
  if (format === 'csv') return csvFile(`${name}.csv`, recordCsv(entries));
  return jsonFile(`${name}.json`, recordJson(ctx.workspace.slug, entries, await uncoveredCategories(ctx, entries)));
}
