// The consent screen as plain HTML, for the server-rendered take-part document: the same markup
// ConsentScreen renders (tests/unit/respondent-document.test.ts keeps the two equal), so the
// page reads the same before the script loads and without it, and the form posts to start.

/** Escapes text and attribute values the way React's server renderer does. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#x27;' })[c]!);
}

export function consentHtml({ consentText, retentionDays, action, pid }: { consentText: string; retentionDays: number; action: string; pid: string | null }): string {
  return `<form class="flex flex-col gap-5" action="${escapeHtml(action)}" method="post">`
    + `<h1 class="text-2xl">Before you start</h1>`
    + `<p class="whitespace-pre-line text-lg leading-relaxed">${escapeHtml(consentText)}</p>`
    + `<ul class="flex flex-col gap-2 border-l-2 border-rule pl-4 text-base text-muted">`
    + `<li>No names or e-mail addresses are stored.</li>`
    + `<li>Your answers are kept for ${retentionDays} days after the study closes, then deleted.</li></ul>`
    + (pid ? `<input type="hidden" name="pid" value="${escapeHtml(pid)}"/>` : '')
    + `<input type="hidden" name="consent" value="true"/>`
    + `<button type="submit" class="flex min-h-14 w-full items-center justify-center rounded border-2 border-teal bg-teal px-4 py-3 text-lg font-semibold text-white active:bg-teal-dark disabled:opacity-50">I agree, start</button>`
    + `</form>`;
}
