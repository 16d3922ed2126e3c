import 'server-only';
// How both import routes (into a study, and as a new study) answer an import: the status says
// what happened, and a refused file still carries its row-numbered check so the import form
// can list every problem, beside the one error shape that API clients read.
import type { ImportCheck } from '@/lib/server/studies/response-import';
import { reply } from './route';

/** 200 for a dry run, 201 once stored, or 422 with `error` and the check (nothing was written). */
export function importReply<R extends { check: ImportCheck; imported: unknown }>(result: R, dryRun: boolean) {
  if (result.check.ok) return reply(result, dryRun ? 200 : 201);
  const n = result.check.errors.length;
  const first = result.check.errors[0];
  const message = `${n} problem${n === 1 ? '' : 's'} found; nothing was imported.${first ? ` Row ${first.row}: ${first.message}` : ''}`;
  return reply({ error: { code: 'validation_failed' as const, message }, ...result }, 422);
}
