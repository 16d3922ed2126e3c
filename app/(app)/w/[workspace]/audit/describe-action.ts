/** Audit actions in the product's words; unknown actions show as recorded. */
const LABELS: Record<string, string> = {
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
  const base = LABELS[action] ?? action;
  if (action === 'member.role_changed' && typeof detail?.label === 'string') return `${base}: ${detail.label}`;
  if ((action === 'invitation.sent' || action === 'member.joined') && typeof detail?.role === 'string') return `${base} (${detail.role})`;
  return base;
}
