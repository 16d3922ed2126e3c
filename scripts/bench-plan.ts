// `npm run bench:plan`: a 50,000-row price list through the promo floor computation and the
// plan CSV export, as the plan page and the export route run them (no database: the list is
// generated in memory). Prints each run; the last line is `bench:plan rows=50000 ms=<median>`.
// Before it, one line times the sample-size planner (lib/psychometrics/planner.ts) on a
// spot-task design with shoppers who differ and catch trials, as its job runs it per candidate size.
import { analyse } from '@/lib/psychometrics/analyse';
import { planDesign } from '@/lib/psychometrics/planner';
import { floorParams } from '@/lib/psychometrics/promo-floor';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateCells } from '@/lib/psychometrics/simulate';
import { computeFloorTable, type PlanItem } from '@/lib/promo/floor-table';
import { planCsv } from '@/lib/promo/plan-export';
import { summarisePlan } from '@/lib/promo/summary';

const ROWS = 50_000;
const RUNS = 7;

function main() {
  // A simulated study (invented observer: Weber slope 0.8), fitted once like a stored plan's fit.
  const observer = { alpha: (b: number) => Math.log(0.07) - 0.2 * Math.log(b / 39), beta: 2.6, lapse: 0.02, guess: 0.5 };
  const bases = [3.49, 12.99, 39, 129, 449];
  const report = analyse({ ...simulateCells(observer, bases, geometricLadder(0.01, 0.25, 8), 240, createRng('bench-plan')), task: 'pick', bootstrap: 0 });
  const params = JSON.parse(JSON.stringify(floorParams(report, 'power')));

  const rng = createRng('bench-plan-list');
  const items: PlanItem[] = Array.from({ length: ROWS }, (_, i) => {
    const price = Math.round(Math.exp(Math.log(0.5) + rng.next() * Math.log(2000)) * 100) / 100;
    return { sku: `HL-${100000 + i}`, name: `Item ${i}, size ${i % 9}`, regularPrice: price, unitCost: i % 10 ? Math.round(price * 0.55 * 100) / 100 : null, category: `Category ${i % 40}` };
  });

  const times: number[] = [];
  let bytes = 0;
  for (let run = 0; run < RUNS; run++) {
    const t0 = performance.now();
    const rows = computeFloorTable(params, { target: 0.75, ending: 'ends-99' }, items);
    const summary = summarisePlan(rows);
    const csv = planCsv('EUR', rows);
    const ms = performance.now() - t0;
    bytes = csv.length;
    times.push(ms);
    process.stdout.write(`run ${run + 1}: ${ms.toFixed(1)} ms (${summary.outsideRange} outside tested range, ${summary.deeperThanMargin} deeper than margin, CSV ${(bytes / 1e6).toFixed(1)} MB)\n`);
  }
  const tPlan = performance.now();
  const plan = planDesign({
    basePrices: bases, rungs: geometricLadder(0.01, 0.25, 8), repetitions: 2, respondents: 200, task: 'spot',
    weberFraction: 0.07, beta: 2.6, lapse: 0.02, guess: 0.1, sigma: 0.4, catchPerBase: 4, simulations: 200, seed: 'bench-planner',
  });
  process.stdout.write(`planner: 200 simulated studies of 200 shoppers (5 bases × 8 rungs × 2, spot, σ ${plan.sigma}) in ${Math.round(performance.now() - tPlan)} ms\n`);
  const sorted = [...times].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)];
  process.stdout.write(`target: under 1000 ms median for ${ROWS} rows (floors + summary + CSV)\n`);
  process.stdout.write(`bench:plan rows=${ROWS} ms=${Math.round(median)}\n`);
}

main();
