// Audit actions in the product's words: the audit page shows sentences, never the stored codes.
// tests/unit/audit-labels.test.ts scans lib/ and app/ for every recorded action and fails when
// one has no sentence here; an action the code no longer records may stay (old entries).
/** Audit actions in the product's words. */
export const LABELS: Record<string, string> = {
  'account.email_confirmed': 'Confirmed their e-mail address',
  'api_token.created': 'Created an access token',
  'api_token.revoked': 'Revoked an access token',
  'billing.payment_mismatch': 'A payment did not match its purchase (no seats added)',
  'link.created': 'Created a respondent link',
  'link.closed': 'Closed a respondent link',
  'price_list.uploaded': 'Uploaded a price list',
  'price_list.deleted': 'Deleted a price list',
  'promo_plan.created': 'Made a promotion plan',
  'promo_plan.deleted': 'Deleted a promotion plan',
  'study.created': 'Created a study',
  'study.created_by_import': 'Created a study from imported responses',
  'study.deleted': 'Deleted a study',
  'study.duplicated': 'Duplicated a study',
  'study.exclusions_changed': 'Changed the respondent exclusion rules',
  'study.picture_uploaded': 'Uploaded a product picture',
  'study.responses_imported': 'Imported responses',
  'study.updated': 'Edited a study',
  'study.resumed': 'Resumed a study',
  'study.responses_purged': 'Deleted the respondents of a study at the end of its retention period',
  'respondent.deleted': 'Deleted one respondent on request (by reference code)',
  'auth.sign_in': 'Signed in',
  'auth.password_reset': 'Reset their password',
  'workspace.created': 'Opened the workspace',
  'workspace.settings_changed': 'Changed the workspace settings',
  'member.role_changed': 'Changed a role',
  'member.removed': 'Removed a member',
  'member.joined': 'Joined through an invitation',
  'invitation.sent': 'Sent an invitation',
  'invitation.revoked': 'Withdrew an invitation',
  'billing.purchase': 'Bought a seat bundle',
  'study.launched': 'Launched a study',
  'study.paused': 'Paused a study',
  'study.closed': 'Closed a study',
};

export function describeAction(action: string, detail: Record<string, unknown> | null): string {
  const base = LABELS[action] ?? `Recorded “${action.replace(/[._]/g, ' ')}”`;
  if (action === 'member.role_changed' && typeof detail?.label === 'string') return `${base}: ${detail.label}`;
  if ((action === 'invitation.sent' || action === 'member.joined') && typeof detail?.role === 'string') return `${base} (${detail.role})`;
  return base;
}
