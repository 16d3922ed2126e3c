// For `npm run bench:library` only (run by it in a child process against its own fresh
// database): fills the demo workspace's threshold record up to N closed studies (default 200),
// each with a finished cached fit, as the page would find them after a few years of research.
// One simulated study (invented observer, own simulation) is fitted once with the engine; every
// bench study stores that full report (curves, bands, shopper spread and all, so the database
// holds realistic rows) with its thresholds scaled, under the cache key its study would use.
// Categories and dates are invented. Usage: tsx --conditions=react-server scripts/load/record-studies.ts 200
import { randomUUID } from 'node:crypto';
import { Study } from '@/entities/study';
import { Workspace } from '@/entities/workspace';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateShopperCells } from '@/lib/psychometrics/simulate';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import { fitCacheKey, FIT_BOOTSTRAP, FIT_SEED } from '@/lib/server/analysis/study-fit';
import { orm } from '@/lib/server/db/orm';
import { toDetail } from '@/lib/server/studies/studies';
import { DEMO_DESIGN } from '../seed/demo-study';
import { DEMO_WORKSPACE } from '../seed/accounts';

const CATEGORIES = ['Kitchen & home', 'Groceries — drinks', 'Household', 'Groceries — pantry', 'Tableware', 'Home — textiles', 'Groceries — dairy', 'Kitchen — tools'];

async function main() {
  const target = Number(process.argv[2] ?? 200);
  const o = await orm();
  try {
    const db = o.em.fork();
    const ws = await db.findOneOrFail(Workspace, { slug: DEMO_WORKSPACE.slug });
    const bases = DEMO_DESIGN.basePrices;
    const observer = { alpha: (b: number) => Math.log(0.07) - 0.2 * Math.log(b / 39), beta: 2.6, lapse: 0.02, guess: 0.5 };
    const shopperCells = simulateShopperCells(observer, bases, geometricLadder(0.01, 0.3, 8), { shoppers: 80, repetitions: 2, sigma: 0.4 }, createRng('bench-record'));
    const t0 = Date.now();
    const report = analyse({ shopperCells, task: 'pick', bootstrap: FIT_BOOTSTRAP, seed: FIT_SEED });
    process.stdout.write(`[bench:library] one engine fit with ${FIT_BOOTSTRAP} bootstrap samples: ${Date.now() - t0} ms (reused for every study)\n`);
    const have = await db.count(Study, { workspace: ws.id, state: { $in: ['closed', 'imported'] } });
    for (let i = have; i < target; i++) {
      const closedAt = new Date(Date.UTC(2023, 0, 15) + i * 5.3 * 86_400_000);
      db.create(Study, {
        workspace: ws.id, name: `Bench study ${i + 1}`, state: 'closed',
        design: { ...DEMO_DESIGN, name: `Bench study ${i + 1}`, category: CATEGORIES[i % CATEGORIES.length] }, exclusionRules: DEFAULT_EXCLUSION_RULES,
        dataVersion: 1, createdAt: closedAt, updatedAt: closedAt, launchedAt: closedAt, closedAt,
      });
    }
    await db.flush();
    const studies = (await db.find(Study, { workspace: ws.id, state: { $in: ['closed', 'imported'] } })).map(toDetail);
    const conn = db.getConnection();
    for (const [i, s] of studies.entries()) {
      const { cacheKey, optionsKey } = fitCacheKey(s, {});
      const k = Math.exp(0.3 * Math.sin(i));
      const scaled = JSON.parse(JSON.stringify(report));
      for (const b of scaled.bases) {
        if (b.threshold.amount) b.threshold.amount *= k;
        if (b.threshold.amountCi) b.threshold.amountCi = b.threshold.amountCi.map((v: number) => v * k);
      }
      scaled.models.power.a += Math.log(k);
      scaled.models.power.draws = scaled.models.power.draws?.map(([a, b]: [number, number]) => [a + Math.log(k), b]);
      const result = { report: scaled, counts: { respondents: { before: 84, after: 80 }, trials: { before: 6720, after: 6400 }, byRule: {} }, cells: [], catchCells: [], optionsKey, computedMs: 0 };
      await conn.execute(
        `insert into analysis_result (id, study_id, kind, cache_key, data_version, status, result, created_at, updated_at)
         values (?, ?, 'fit', ?, ?, 'done', ?::jsonb, now(), now()) on conflict (study_id, kind, cache_key) do update set status = 'done', result = excluded.result`,
        [randomUUID(), s.id, cacheKey, s.dataVersion, JSON.stringify(result)],
      );
    }
    process.stdout.write(`[bench:library] ${studies.length} closed studies with cached fits in workspace ${ws.slug}\n`);
  } finally {
    await o.close(true);
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`[bench:library] seeding failed: ${err instanceof Error ? err.stack : String(err)}\n`);
  process.exit(1);
});
