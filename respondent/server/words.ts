import 'server-only';
// Respondent-facing refusals in the study's language. A refusal's JSON message (and the stop
// screen the server renders from it) comes from the study's catalogue (respondent/messages),
// so the phone shows the server's words as they are. The error's code and status stay the
// API's (lib/server/http/errors.ts); field issues stay in English, for whoever reads the API.
// A refusal that knows no study (an unknown link) follows the browser's Accept-Language.
import { AppError, type ErrorCode, type FieldIssue } from '@/lib/server/http/errors';
import type { Language } from '@/lib/schemas/study.schema';
import { messagesFor } from '@/respondent/messages/all';
import { fill, type Messages } from '@/respondent/messages/format';

/** An AppError worded for a respondent, knowing its language (the stop document's `<html lang>` and title). */
export class RespondentError extends AppError {
  constructor(status: number, code: ErrorCode, message: string, public readonly language: Language, issues?: FieldIssue[]) {
    super(status, code, message, issues);
  }
}

export type StopWord = Exclude<keyof Messages['stop'], 'titles'>;

/** A refusal worded from the study's catalogue. */
export function refusal(language: Language, status: number, code: ErrorCode, word: StopWord, vars: Record<string, string | number> = {}, issues?: FieldIssue[]): RespondentError {
  return new RespondentError(status, code, fill(messagesFor(language).stop[word], vars), language, issues);
}

/** The language a refusal was worded in (English for errors not made here). */
export const languageOf = (err: unknown): Language => (err instanceof RespondentError ? err.language : 'en');
