// Words a user typed (a workspace name, a display name) placed in an e-mail we send to someone
// else. They must read as data, never as our own sentence: an attacker can name a workspace
// "Your account is locked — call +1 555 0100" or "Verify at evil.example" and have the app's
// own mail carry it. So such a value is flattened to one short line (controls, line breaks and
// invisible format characters removed), anything that looks like a web or mail address is
// defanged so no mail client turns it into a link ("evil[.]example", "hxxp"), and it is shown
// in «guillemets» inside a sentence of ours that says who typed it. Never in a subject line.
// Tests: tests/unit/mail-quote.test.ts.

const MAX = 140; // names are at most 120 characters; defanging adds a few

/** One line, no controls or invisible characters, no link-shaped text, at most 140 characters. */
export function plainName(raw: string): string {
  let s = raw
    .normalize('NFKC')
    .replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, ' ')
    .replace(/[\u00ad\u061c\u180e\u200b-\u200f\u202a-\u202e\u2060-\u206f\ufeff]/g, '')
    .replace(/[«»]/g, '"')
    .replace(/\s+/g, ' ')
    .trim();
  s = s
    .replace(/\b(https?|ftp|mailto|tel|file|data|javascript)\s*:/gi, (_m, scheme: string) => `${scheme.replace(/^http/i, 'hxxp')}[:]`)
    .replace(/\bwww\./gi, 'www[.]')
    .replace(/([\p{L}\p{N}-])\.(?=\p{L}[\p{L}\p{N}-])/gu, '$1[.]')
    .replace(/@/g, '[at]');
  if (s.length > MAX) s = `${s.slice(0, MAX - 1).trimEnd()}…`;
  return s || '(no name)';
}

/** The value in guillemets, ready to sit inside a sentence of ours. */
export function quoted(raw: string): string {
  return `«${plainName(raw)}»`;
}
