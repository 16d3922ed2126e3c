// What a line of the seat ledger is about, in words for the Billing page: a purchase by its
// receipt number, a complete as "Complete by a respondent" (or "Excluded complete", with the
// rules that exclude it) and its study, welcome seats and corrections by name. The raw
// reference a line is keyed by (a checkout session id, a respondent id, a workspace id) is
// bookkeeping and never shown. Pure; tests: tests/unit/ledger-words.test.ts, e2e billing-team.

export interface LedgerLine {
  reason: string;
  note: string | null;
  complete: { studyName: string; excludedBy: string[] } | null;
  purchase: { receipt: string | null; bundle: string; seats: number } | null;
}

export interface LedgerWords {
  /** The reason, as a short name. */
  title: string;
  /** What it is about: a receipt, a study; null when the title says it all. */
  about: string | null;
  /** For an excluded complete: why it is left out of the analysis. */
  excluded: string | null;
}

export function ledgerWords(e: LedgerLine): LedgerWords {
  switch (e.reason) {
    case 'purchase':
      return {
        title: e.purchase ? `${e.purchase.bundle} bundle bought` : 'Bundle bought',
        about: e.purchase?.receipt ? `Receipt ${e.purchase.receipt}` : 'Receipt to follow once the payment is confirmed',
        excluded: null,
      };
    case 'complete':
      if (!e.complete) return { title: 'Complete by a respondent', about: 'Study or respondent since deleted', excluded: null };
      return e.complete.excludedBy.length
        ? { title: 'Excluded complete', about: e.complete.studyName, excluded: `Left out of the analysis (${e.complete.excludedBy.join('; ')}); the seat was used` }
        : { title: 'Complete by a respondent', about: e.complete.studyName, excluded: null };
    case 'welcome':
      return { title: 'Welcome seats', about: e.note ?? 'Free seats for a new workspace', excluded: null };
    case 'adjustment':
      return { title: 'Correction', about: e.note, excluded: null };
    default:
      return { title: 'Other change', about: e.note, excluded: null };
  }
}
