'use client';
import type { ExclusionCounts } from '@/lib/exclusions';
import type { ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { allExcludedMessage, rulesThatRemoved } from '@/lib/results-text';

// When the exclusion rules leave nobody to fit: which rule removed how many respondents, and a
// way to relax them (the rules panel further down this page). Null when someone is left.

export function AllExcluded({ counts, rules, rulesHref, canEdit }: { counts: ExclusionCounts; rules: ExclusionRules; rulesHref: string; canEdit: boolean }) {
  const message = allExcludedMessage(counts, rules);
  if (!message) return null;
  const top = rulesThatRemoved(counts, rules)[0];
  return (
    <div className="card border-brick p-4" role="alert" data-testid="all-excluded">
      <h2 className="mb-1 text-xl">No respondent is left to fit</h2>
      <p className="max-w-prose text-sm">{message}</p>
      <p className="mt-3 text-sm">
        <a className="btn" href={rulesHref} data-testid="relax-rules">{canEdit ? `Relax the rules${top ? ` (start with “${top.label}”)` : ''}` : 'See the rules in force'}</a>
      </p>
      {!canEdit ? <p className="hint mt-2">Analysts and owners can change the rules.</p> : null}
    </div>
  );
}
