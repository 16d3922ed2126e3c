import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from '@/lib/csv';
import { brokenRules } from '@/lib/exclusions';
import { DEFAULT_EXCLUSION_RULES, rulesOrDefault } from '@/lib/schemas/exclusions.schema';

describe('CSV writing (RFC 4180, no BOM, formula-safe)', () => {
  it('quotes only when needed and doubles quotes', () => {
    expect(csvCell('plain')).toBe('plain');
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell('two\nlines')).toBe('"two\nlines"');
    expect(csvCell(null)).toBe('');
    expect(csvCell(Number.NaN)).toBe('');
    expect(csvCell(0.125)).toBe('0.125');
  });
  it('neutralises spreadsheet formulas in text but keeps negative numbers', () => {
    expect(csvCell('=HYPERLINK("x")')).toBe('"\'=HYPERLINK(""x"")"');
    expect(csvCell('-12')).toBe('-12');
    expect(csvCell('@sum')).toBe("'@sum");
  });
  it('ends every record with CRLF and starts without a BOM', () => {
    const out = toCsv(['Base price (EUR)', 'Verdict'], [[3.49, 'fits well'], [12.99, 'poor fit']]);
    expect(out).toBe('Base price (EUR),Verdict\r\n3.49,fits well\r\n12.99,poor fit\r\n');
    expect(out.charCodeAt(0)).not.toBe(0xfeff);
  });
});

describe('exclusion rules', () => {
  const q = { task: 'spot' as const, catchTrials: 10, catchYes: 2, testTrials: 80, testYes: 40, medianMs: 1500, attentionPassed: true };
  it('a careful respondent breaks nothing', () => expect(brokenRules(q, DEFAULT_EXCLUSION_RULES)).toEqual([]));
  it('names every broken rule in a fixed order, only when switched on', () => {
    const bad = { task: 'spot' as const, catchTrials: 10, catchYes: 10, testTrials: 80, testYes: 80, medianMs: 250, attentionPassed: false };
    expect(brokenRules(bad, DEFAULT_EXCLUSION_RULES)).toEqual(['attention', 'falseAlarms', 'speeders', 'straightLining']);
    expect(brokenRules(bad, { ...DEFAULT_EXCLUSION_RULES, speeders: { enabled: false, minMedianMs: 400 } })).not.toContain('speeders');
  });
  it('the false-alarm limit is "clearly above": at or a little above the limit stays in (exact binomial test, 5 %)', () => {
    expect(brokenRules({ ...q, catchYes: 5 }, DEFAULT_EXCLUSION_RULES)).toEqual([]);
    expect(brokenRules({ ...q, catchYes: 6 }, DEFAULT_EXCLUSION_RULES)).toEqual([]);
    expect(brokenRules({ ...q, catchYes: 9 }, DEFAULT_EXCLUSION_RULES)).toEqual(['falseAlarms']);
  });
  it('rules with nothing to judge never exclude (no catch trials, no attention check, no times)', () => {
    expect(brokenRules({ ...q, catchTrials: 0, catchYes: 0, attentionPassed: null, medianMs: null }, DEFAULT_EXCLUSION_RULES)).toEqual([]);
  });
  it('stored rules of an unknown shape fall back to the defaults', () => {
    expect(rulesOrDefault(null)).toEqual(DEFAULT_EXCLUSION_RULES);
    expect(rulesOrDefault({ attention: true })).toEqual(DEFAULT_EXCLUSION_RULES);
  });
});
