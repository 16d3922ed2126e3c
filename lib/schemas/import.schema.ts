import { z } from 'zod';
import { CURRENCIES, TASKS } from './study.schema';

// Response import: the CSV's columns, one row's schema, and the minimal design of a study
// created by an import. Header is row 1, so the first data row is row 2.

export const IMPORT_MAX_BYTES = 10 * 1024 * 1024;
export const REQUIRED_COLUMNS = ['respondent', 'base_price', 'discount', 'response'] as const;
/** Optional: response_ms is used when present; the others (as written by our own trials export) are ignored. */
export const OPTIONAL_COLUMNS = ['response_ms', 'link_source', 'attention_passed', 'kind', 'excluded_by'] as const;
export const SEGMENT_PREFIX = 'segment_';

const numberCell = (what: string) => z.string().trim().min(1, `${what} is empty`).refine((v) => Number.isFinite(Number(v)), `${what} is not a number`).transform(Number);

export const importRowSchema = z.object({
  respondent: z.string().trim().min(1, 'respondent is empty').max(120, 'respondent is longer than 120 characters'),
  base_price: numberCell('base_price').pipe(z.number().gt(0, 'base_price must be above 0').max(1_000_000, 'base_price must be at most 1,000,000')),
  discount: numberCell('discount').pipe(z.number().min(0, 'discount must be from 0 (catch trial) to below 1').lt(1, 'discount must be a fraction below 1 (e.g. 0.12 for 12 %)')),
  response: z.string().trim().refine((v) => v === '0' || v === '1', 'response must be 0 or 1').transform((v) => (v === '1' ? 1 : 0) as 0 | 1),
  response_ms: z.string().trim().optional().transform((v, ctx) => {
    if (v === undefined || v === '') return 0;
    const n = Number(v);
    if (!Number.isInteger(n) || n < 0 || n > 3_600_000) { ctx.addIssue({ code: 'custom', message: 'response_ms must be a whole number of milliseconds' }); return z.NEVER; }
    return n;
  }),
});
export type ImportRow = z.infer<typeof importRowSchema>;

export const importedStudySchema = z.object({
  name: z.string().trim().min(3, 'Name the study (at least 3 characters).').max(160, 'At most 160 characters.'),
  itemName: z.string().trim().min(2, 'Name the item.').max(80, 'At most 80 characters.'),
  category: z.string().trim().min(2, 'Give the item category.').max(80, 'At most 80 characters.'),
  currency: z.enum(CURRENCIES, { error: 'Choose a currency.' }),
  task: z.enum(TASKS, { error: 'Choose the task the responses came from.' }),
});
export type ImportedStudyInput = z.infer<typeof importedStudySchema>;
