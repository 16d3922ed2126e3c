import { route } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { AppError } from '@/lib/server/http/errors';
import { EXPORT_FORMATS, exportPlan, type ExportFormat } from '@/lib/server/promotions/plan-export';

/** ?format=csv (the items), about-csv (settings and cautions, the CSV's side file) or json. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) => {
  const format = req.nextUrl.searchParams.get('format') ?? 'csv';
  if (!(EXPORT_FORMATS as readonly string[]).includes(format)) throw new AppError(422, 'validation_failed', `Unknown format “${format}”; use csv, about-csv or json.`, [{ path: 'format', message: 'Use csv, about-csv or json.' }]);
  return download(await exportPlan(ctx, params.plan, format as ExportFormat));
});
