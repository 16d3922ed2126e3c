import 'server-only';
// Panel ids (?pid=) and the reference code a respondent is given.
//
// A panel id is kept only to stop one panelist taking part twice (DESIGN.md, Cautions). Three
// rules hold on every start path — the script's JSON start, the plain-form (no-script) start and
// the take-part page:
// 1. Length: at most MAX_PID_LENGTH characters (the column's size); a longer one is a 422 on
//    the field `pid` (the no-script path shows it on the stop screen), never a 500.
// 2. One refusal: a start naming a panel id the study already has — finished or not — gets the
//    same status, code and words (PID_TAKEN), so a refusal does not tell a stranger whether
//    that panelist finished. The device that started keeps going with its resume cookie.
// 3. Nobody can use up ("burn") another panelist's id first, on links that ask for it: the
//    link then carries a signing key (respondent_link.pid_secret, shown to analysts once the
//    option is on) and the panel adds `&sig=` = hex HMAC-SHA-256(key, pid) to each panelist's
//    address — the usual way panels sign their redirects. The take-part page checks the
//    signature and keeps it in an HttpOnly cookie on /r for that link; the start (JSON or plain
//    form) takes the id only with that cookie matching. An id typed or guessed by someone else
//    has no valid signature, so it can neither start nor block the panelist.
//    Why this and not binding the id to the first device's resume cookie: that binding
//    already exists (a second device is refused), but whoever arrives first is that "first
//    device"; only a secret the stranger lacks stops the burn. Links without the option keep
//    the first-device binding, and the links page says so (a panel that numbers its members
//    1, 2, 3… should turn signing on).
import { createHmac, randomInt, timingSafeEqual } from 'node:crypto';
import type { Language } from '@/lib/schemas/study.schema';
import { refusal } from './words';

export const MAX_PID_LENGTH = 120;

export const PID_TAKEN = (language: Language) => refusal(language, 409, 'already_taken_part', 'pidTaken');

const TOO_LONG = (language: Language) =>
  refusal(language, 422, 'validation_failed', 'pidTooLong', { n: MAX_PID_LENGTH }, [{ path: 'pid', message: `At most ${MAX_PID_LENGTH} characters.` }]);

const UNSIGNED = (language: Language) => refusal(language, 403, 'forbidden', 'pidUnsigned');

/** The panel id as given, trimmed; null when empty; a 422 when too long. */
export function checkedPid(raw: string | null | undefined, language: Language = 'en'): string | null {
  const pid = (raw ?? '').trim();
  if (!pid) return null;
  if (pid.length > MAX_PID_LENGTH) throw TOO_LONG(language);
  return pid;
}

/** What the panel appends as &sig= for this id. */
export function pidSignature(secret: string, pid: string): string {
  return createHmac('sha256', secret).update(pid, 'utf8').digest('hex');
}

function sameSignature(secret: string, pid: string, sig: string | null | undefined): boolean {
  if (!sig || !/^[0-9a-fA-F]{64}$/.test(sig)) return false;
  return timingSafeEqual(Buffer.from(pidSignature(secret, pid), 'hex'), Buffer.from(sig, 'hex'));
}

/** The cookie keeping a checked signature between the take-part page and the start. */
export const pidProofCookieName = (linkId: string) => `nw_p_${linkId.replace(/-/g, '')}`;

export function pidProofCookie(linkId: string, sig: string, secure: boolean): string {
  return `${pidProofCookieName(linkId)}=${sig.toLowerCase()}; Path=/r; Max-Age=86400; HttpOnly; SameSite=Lax${secure ? '; Secure' : ''}`;
}

/** Refuses a panel id on a signing link unless the signature (from the address or the cookie) matches. */
export function requireSignedPid(secret: string | null, pid: string | null, sig: string | null | undefined, language: Language = 'en'): void {
  if (!secret || !pid) return;
  if (!sameSignature(secret, pid, sig)) throw UNSIGNED(language);
}

// Crockford's base32 without I, L, O, U: read aloud or typed without mix-ups.
const CODE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

/**
 * The reference code on the thank-you screen: 10 random characters (50 bits), shown as
 * XXXXX-XXXXX. It lets a respondent ask for their answers to be deleted without telling anyone
 * who they are; it is not the respondent's id and cannot be guessed from one.
 */
export function newReferenceCode(): string {
  let s = '';
  for (let i = 0; i < 10; i++) s += CODE_ALPHABET[randomInt(32)];
  return `${s.slice(0, 5)}-${s.slice(5)}`;
}

/** A code as an analyst may type it (lower case, spaces, no dash, O for 0, I/L for 1) in the stored form. */
export function normalReferenceCode(raw: string): string | null {
  const s = raw.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1');
  if (!/^[0-9A-HJKMNP-TV-Z]{10}$/.test(s)) return null;
  return `${s.slice(0, 5)}-${s.slice(5)}`;
}
