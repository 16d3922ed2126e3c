// Respondent messages: every fixed string a respondent sees comes from one catalogue per
// language (en.ts, whose shape is the `Messages` type, and de, fr, es, nl). The study design
// names the language (StudyDesign.language, 'en' for older studies through readDesign).
// Only the chosen catalogue reaches a phone: the server puts it in the take-part document's
// boot data (respondent/shared/boot.ts), and the flow's screens take it as a prop (`m`), so
// the client bundle holds no catalogue at all (`npm run size:respondent` fails if one is there).
// The server picks a catalogue with messagesFor() in ./all.ts; unknown links follow the
// browser's Accept-Language. This file is imported by the bundle: no catalogue imports here.
// Tests: tests/unit/respondent-messages.test.ts renders every screen in every language.
import type { Messages } from './en';

export type { Messages };

/** `template` with each {name} replaced by vars.name (numbers as given: format them first). */
export function fill(template: string, vars: Record<string, string | number>): string {
  return template.replace(/\{(\w+)\}/g, (whole, name: string) => (name in vars ? String(vars[name]) : whole));
}

/**
 * `template` split around {name} placeholders, for sentences holding an element (a price in
 * bold): text parts and the given nodes in order.
 */
export function fillParts<T>(template: string, vars: Record<string, T | string | number>): (T | string)[] {
  const out: (T | string)[] = [];
  let last = 0;
  for (const match of template.matchAll(/\{(\w+)\}/g)) {
    const v = vars[match[1]];
    if (v === undefined) continue;
    if (match.index > last) out.push(template.slice(last, match.index));
    out.push(typeof v === 'number' ? String(v) : v);
    last = match.index + match[0].length;
  }
  if (last < template.length) out.push(template.slice(last));
  return out;
}
