// Protects issue 14's "audit entries read as sentences, never codes": every audit action the
// code records has a sentence on the audit page.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { LABELS, describeAction } from '@/app/(app)/w/[workspace]/audit/describe-action';

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return sources(p);
    return /\.(ts|tsx)$/.test(name) ? [p] : [];
  });
}

const recorded = new Set<string>();
for (const file of [...sources('lib'), ...sources('app')]) {
  const text = readFileSync(file, 'utf8');
  for (const m of text.matchAll(/action: '([a-z_]+\.[a-z_]+)'/g)) recorded.add(m[1]);
  for (const m of text.matchAll(/: '(study\.[a-z_]+)'/g)) recorded.add(m[1]);
}

describe('audit page words', () => {
  it('finds the recorded actions in the source (the scan itself works)', () => {
    expect(recorded.has('study.launched')).toBe(true);
    expect(recorded.has('invitation.sent')).toBe(true);
    expect(recorded.size).toBeGreaterThan(20);
  });

  it('has a sentence for every action the code records', () => {
    const missing = [...recorded].filter((a) => !(a in LABELS));
    expect(missing).toEqual([]);
  });

  it('never shows a bare code, even for an unknown action', () => {
    expect(describeAction('widget.frobbed', null)).not.toMatch(/widget\.frobbed/);
    expect(describeAction('study.created', null)).toBe('Created a study');
  });
});
