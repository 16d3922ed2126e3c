import 'server-only';
import { Study } from '@/entities/study';
import { fitCacheKey } from '@/lib/server/analysis/study-fit';
import { em } from '@/lib/server/db/orm';
import { sql } from '@/lib/server/db/sql';
import { toDetail } from '@/lib/server/studies/studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import type { BasisOption } from '@/lib/promo/floor-basis';

// For the new-plan form: which floor bases each fittable study offers, read from its latest
// finished fit (all respondents, its current rules) without loading the whole result: the
// shares of shoppers its mixed model reports, or why there are none (no shopper ids, no model).
// createPromoPlan checks the same again on the fit it uses, so this only informs the form.


export async function basisOptions(ctx: WorkspaceContext, studyIds: readonly string[]): Promise<Record<string, BasisOption>> {
  if (!studyIds.length) return {};
  const db = await em();
  const studies = await db.find(Study, { id: { $in: [...studyIds] }, workspace: ctx.workspace.id });
  const out: Record<string, BasisOption> = {};
  for (const s of studies) {
    const { optionsKey } = fitCacheKey(toDetail(s), {});
    const [row] = await sql<{ unit: string | null; shares: number[] | null; has_spread: boolean }>(
      db,
      `select result -> 'report' ->> 'unit' as unit,
              jsonb_typeof(result -> 'report' -> 'shopperSpread') = 'object' as has_spread,
              (select array_agg(distinct (x ->> 'share')::float8 order by (x ->> 'share')::float8)
                 from jsonb_array_elements(coalesce(result -> 'report' -> 'shopperSpread' -> 'bases', '[]'::jsonb)) b,
                      jsonb_array_elements(coalesce(b -> 'shares', '[]'::jsonb)) x) as shares
         from analysis_result
        where study_id = ? and kind = 'fit' and status = 'done' and result ->> 'optionsKey' = ?
        order by data_version desc, updated_at desc limit 1`,
      [s.id, optionsKey],
    );
    if (!row) { out[s.id] = { shares: [], shareUnavailable: 'The study’s fit is not computed yet: open its results first.' }; continue; }
    const shares = (row.shares ?? []).map(Number);
    out[s.id] = row.has_spread && shares.length
      ? { shares, shareUnavailable: null }
      : { shares: [], shareUnavailable: row.unit === 'trial' ? 'The study’s data carry no shopper ids (e.g. imported cell counts), so how far shoppers differ is unknown.' : 'This study’s fit has no shopper-level model (how far shoppers differ).' };
  }
  return out;
}
