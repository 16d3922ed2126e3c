// The e2e tier's accessibility check: axe-core (the npm package, no browser download) run in the
// page under test. Its source goes in through Playwright's evaluate, which the DevTools protocol
// runs outside the page's Content-Security-Policy, so the strict respondent pages need no
// exception. `expectAccessible(page, 'name')` throws on any violation of WCAG 2.x A/AA rules
// (labels, names, contrast, landmarks …) and writes the full report to
// .test-output/a11y/<name>.json; `axeViolations` returns the violations for a test that keeps a
// list of known ones.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { Page } from 'playwright-core';
import type { AxeResults, Result, RunOptions } from 'axe-core';

export const A11Y_DIR = path.resolve(__dirname, '../../.test-output/a11y');
/** WCAG 2.0–2.2 levels A and AA: what a public page owes its users. */
export const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

let source: string | null = null;
function axeSource(): string {
  source ??= readFileSync(createRequire(__filename).resolve('axe-core/axe.min.js'), 'utf8');
  return source;
}

export interface A11yOptions {
  /** CSS selector of the part of the page to check (default: the whole document). */
  include?: string;
  /** Rule ids left out, each with the reason in the calling test. */
  disableRules?: string[];
  /** Tags of the rules to run (default WCAG_TAGS); add 'best-practice' for the stricter set. */
  tags?: string[];
}

export interface A11yViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/** Runs axe-core in the page and returns its violations (also saved to .test-output/a11y/<name>.json). */
export async function axeViolations(page: Page, name: string, opts: A11yOptions = {}): Promise<A11yViolation[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe === 'object');
  if (!loaded) await page.evaluate(axeSource());
  const runOptions: RunOptions = {
    runOnly: { type: 'tag', values: opts.tags ?? WCAG_TAGS },
    rules: Object.fromEntries((opts.disableRules ?? []).map((id) => [id, { enabled: false }])),
    resultTypes: ['violations'],
  };
  const results = await page.evaluate(
    ([include, options]) => (window as unknown as { axe: { run(ctx: unknown, o: unknown): Promise<AxeResults> } }).axe.run(include ? { include: [include] } : document, options),
    [opts.include ?? null, runOptions] as const,
  );
  mkdirSync(A11Y_DIR, { recursive: true });
  writeFileSync(path.join(A11Y_DIR, `${name}.json`), JSON.stringify({ url: results.url, violations: results.violations }, null, 2));
  return results.violations.map((v: Result) => ({ id: v.id, impact: v.impact ?? null, help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }));
}

/** One line per violation: rule, impact, what it asks, and where. */
export function describeViolations(vs: A11yViolation[]): string {
  return vs.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.targets.slice(0, 5).join(', ')}${v.targets.length > 5 ? ` and ${v.targets.length - 5} more` : ''}`).join('\n');
}

/** Fails with a readable list when the page (or `include`) has any accessibility violation. */
export async function expectAccessible(page: Page, name: string, opts: A11yOptions = {}): Promise<void> {
  const vs = await axeViolations(page, name, opts);
  if (vs.length) throw new Error(`accessibility violations on ${name} (${page.url()}):\n${describeViolations(vs)}`);
}
