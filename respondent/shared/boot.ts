import type { Language, SegmentQuestion } from '@/lib/schemas/study.schema';
import type { Messages } from '@/respondent/messages/format';
import type { FlowState, FlowStudy } from './types';

/** The element ids shared by the server-rendered document and the standalone client bundle. */
export const ROOT_ID = 'respondent-root';
export const BOOT_ID = 'respondent-boot';

/**
 * What the take-part document hands its script, in a `<script type="application/json">` data
 * block (allowed by the CSP, unlike an inline script).
 */
export interface RespondentBoot {
  token: string;
  resumeToken: string | null;
  pid: string | null;
  initial: FlowState | null;
  study: FlowStudy;
  consentText: string;
  retentionDays: number;
  questions: SegmentQuestion[];
  /** The study's language and its catalogue: the only one this page loads (respondent/messages/format.ts). */
  language: Language;
  messages: Messages;
}

/** JSON safe inside a script element: `<` escaped so no `</script>` can end it early. */
export function bootJson(boot: RespondentBoot): string {
  return JSON.stringify(boot).replace(/</g, '\\u003c').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');
}
