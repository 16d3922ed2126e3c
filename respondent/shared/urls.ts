// The addresses of one respondent link, for the server (redirects, boot data, form action) and
// the phone (its fetch calls). Everything sits under /r/[token] so the resume cookie, scoped to
// the path /r, travels with every respondent request.

export function respondentUrls(linkToken: string) {
  const base = `/r/${encodeURIComponent(linkToken)}`;
  return {
    /** The shared link: checks the link and continues to take-part. */
    link: base,
    /** The flow document (consent form first, or the screens to resume). */
    takePart: `${base}/take-part`,
    start: `${base}/start`,
    complete: `${base}/complete`,
    state: `${base}/state`,
    /** Batches of answers, stored once per (respondent, trial). */
    answers: `${base}/answers`,
    picture: `${base}/picture`,
  };
}
