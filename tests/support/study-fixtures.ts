// A valid study design for tests, and helpers to call the study routes.
import type { StudyDesignInput } from '@/lib/schemas/study.schema';
import { newStudyDefaults } from '@/lib/study-defaults';

export function validDesign(over: Partial<StudyDesignInput> = {}): StudyDesignInput {
  return {
    ...newStudyDefaults(12345),
    name: 'Olive oil thresholds',
    itemName: 'Extra virgin olive oil, 1 l',
    category: 'Pantry',
    basePrices: [9.99, 2.49, 49],
    ladder: [0.02, 0.05, 0.1, 0.2],
    repetitions: 3,
    contact: 'Pricing research, Test Grocers Ltd — research@example.test',
    ...over,
  };
}

/** The smallest valid PNG (1×1, transparent), for upload tests. */
export const TINY_PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
