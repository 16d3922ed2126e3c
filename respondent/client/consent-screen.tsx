import { primaryButton } from './price-tag';

/**
 * The one consent screen. The server renders it into the take-part document as a real form
 * posting to the start route, so a respondent whose phone has not loaded the script (or runs
 * none) can still begin; the script then hydrates the same markup and starts without a reload.
 * No hooks, so the server can render it.
 */
export function ConsentScreen({ consentText, contact, retentionDays, action, pid, onAgree }: {
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
      <h1 className="text-2xl">Before you start</h1>
      <p className="whitespace-pre-line text-lg leading-relaxed">{consentText}</p>
      <ul className="flex flex-col gap-2 border-l-2 border-rule pl-4 text-base text-muted">
        <li>No names or e-mail addresses are stored.</li>
        <li>Your answers are kept for {retentionDays} days after the study closes, then deleted.</li>
        {contact ? <li data-testid="consent-contact">Who runs this study: {contact}</li> : null}
        <li>At the end you get a reference code: quote it to ask for your answers to be deleted.</li>
      </ul>
      {pid ? <input type="hidden" name="pid" value={pid} /> : null}
      <input type="hidden" name="consent" value="true" />
      <button type="submit" className={primaryButton}>I agree, start</button>
    </form>
  );
}
