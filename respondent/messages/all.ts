// Every catalogue, for the server (the take-part document's boot data, stop screens, respondent
// error messages) and the analyst's preview. Never imported by respondent/client: a phone gets
// only its study's catalogue, in the boot data (./format.ts says why).
import { LANGUAGES, type Language } from '@/lib/schemas/study.schema';
import de from './de';
import en, { type Messages } from './en';
import es from './es';
import fr from './fr';
import nl from './nl';

export const CATALOGUES: Record<Language, Messages> = { en, de, fr, es, nl };

/** The catalogue of a study's language (English for anything unknown). */
export function messagesFor(language: string | null | undefined): Messages {
  return CATALOGUES[(LANGUAGES as readonly string[]).includes(language ?? '') ? (language as Language) : 'en'];
}

/**
 * The language for a page no study stands behind (an unknown link): the browser's first
 * Accept-Language entry we have a catalogue for, by quality; English otherwise.
 */
export function languageFromAcceptLanguage(header: string | null | undefined): Language {
  const ranked = (header ?? '')
    .split(',')
    .map((part, i) => {
      const [tag, ...params] = part.trim().toLowerCase().split(';');
      const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
      return { base: tag.split('-')[0], q: q ? Number(q.slice(2)) : 1, i };
    })
    .filter((e) => e.base && Number.isFinite(e.q) && e.q > 0)
    .sort((a, b) => b.q - a.q || a.i - b.i);
  const hit = ranked.find((e) => (LANGUAGES as readonly string[]).includes(e.base));
  return hit ? (hit.base as Language) : 'en';
}
