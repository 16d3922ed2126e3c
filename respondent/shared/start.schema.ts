import { z } from 'zod';
import type { FlowState } from './types';

// POST /r/[token]/start: what the phone sends and what it gets back. The server parses the body
// with this schema; the client types its request and reply from here (types only: no zod in
// the phone's bundle).

export const startSchema = z.strictObject({
  consent: z.literal(true, 'Agree to the consent text to take part.'),
  pid: z.string().trim().min(1).max(120).optional(),
  segmentAnswers: z.record(z.string(), z.string().max(80)).default({}),
});

/** The body as the phone sends it (segment answers may be left out). */
export type StartRequest = z.input<typeof startSchema>;
/** The body once parsed, as the server uses it. */
export type StartInput = z.output<typeof startSchema>;

/** The next screens, and the token that resumes this respondent (also set as a cookie on /r). */
export type StartReply = FlowState & { resumeToken: string };
