import { fill, type Messages } from '@/respondent/messages/format';
import { primaryButton } from './price-tag';

/**
 * The one consent screen. The server renders it into the take-part document as a real form
 * posting to the start route, so a respondent whose phone has not loaded the script (or runs
 * none) can still begin; the script then hydrates the same markup and starts without a reload.
 * No hooks, so the server can render it.
 */
export function ConsentScreen({ m, consentText, contact, retentionDays, action, pid, onAgree }: {
  m: Messages;
  consentText: string;
  /** Who runs the study and how to reach them (required at launch). */
  contact?: string;
  retentionDays: number;
  action?: string;
  pid?: string | null;
  onAgree?: () => void;
}) {
  return (
    <form
      method="post"
      action={action}
      className="flex flex-col gap-5"
      onSubmit={(e) => {
        if (!onAgree) return;
        e.preventDefault();
        onAgree();
      }}
    >
      <h1 className="text-2xl">{m.consent.title}</h1>
      <p className="whitespace-pre-line text-lg leading-relaxed">{consentText}</p>
      <ul className="flex flex-col gap-2 border-l-2 border-rule pl-4 text-base text-muted">
        <li>{m.consent.noNames}</li>
        <li>{fill(m.consent.retention, { days: retentionDays })}</li>
        {contact ? <li data-testid="consent-contact">{fill(m.consent.contact, { contact })}</li> : null}
        <li>{m.consent.reference}</li>
      </ul>
      {pid ? <input type="hidden" name="pid" value={pid} /> : null}
      <input type="hidden" name="consent" value="true" />
      <button type="submit" className={primaryButton}>{m.consent.agree}</button>
    </form>
  );
}
