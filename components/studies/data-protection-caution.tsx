// The data-protection caution analysts see beside the consent text (study builder) and the
// panel-id option (links): what the product cannot decide for them. Plain words, no legal advice.

export function DataProtectionCaution({ about }: { about: 'consent' | 'panel-id' }) {
  return (
    <aside className="border-l-2 border-amber bg-card px-3 py-2 text-sm" aria-label="Data protection" data-testid={`data-protection-${about}`}>
      <strong>Data protection.</strong>{' '}
      {about === 'panel-id'
        ? 'A panel id links answers to a person the panel knows, so those answers are personal data. '
        : 'Answers are personal data once they can be linked to a person (a panel id, a small segment). '}
      You need a lawful basis for collecting them (consent, or another basis your law allows); do not survey children unless
      your law’s safeguards for minors are met; keep segment questions away from sensitive matters (health, religion, origin,
      politics, sexuality) unless you must and may ask them. Rules differ by country: local law and a qualified adviser decide.
    </aside>
  );
}
