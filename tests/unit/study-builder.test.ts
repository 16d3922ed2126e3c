import { describe, expect, it } from 'vitest';
import { parseLadder } from '@/app/(app)/w/[workspace]/studies/_components/ladder-editor';
import { summarise } from '@/app/(app)/w/[workspace]/studies/_components/builder-summary';
import { studyDesignSchema, trialsPerRespondent, estimatedMinutes } from '@/lib/schemas/study.schema';
import { allowedActions } from '@/lib/study-states';
import { sniffPicture } from '@/lib/server/studies/assets';
import { validDesign, TINY_PNG } from '../support/study-fixtures';

describe('builder helpers', () => {
  it('reads a typed ladder in percent as fractions, keeping junk visible to the schema', () => {
    expect(parseLadder('1, 2.5;10  25%')).toEqual([0.01, 0.025, 0.1, 0.25]);
    expect(parseLadder('7')).toEqual([0.07]);
    expect(Number.isNaN(parseLadder('5, abc')[1])).toBe(true);
    expect(studyDesignSchema.safeParse(validDesign({ ladder: parseLadder('5, abc') })).success).toBe(false);
  });

  it('the live summary agrees with the schema helpers on a valid design', () => {
    const design = studyDesignSchema.parse(validDesign({ basePrices: ['2.49', '9.99', '49'], repetitions: '3' as never }));
    const s = summarise(validDesign({ basePrices: ['2.49', '9.99', '49'], repetitions: '3' as never }) as Record<string, unknown>);
    expect(s.trials).toEqual(trialsPerRespondent(design));
    expect(s.minutes).toBe(estimatedMinutes(design));
    // 3 bases × 4 rungs × 3 reps = 36, + round(36 · 0.15 / 0.85) = 6 catch, + 3 practice + 1 attention.
    expect(s.trials.total).toBe(46);
  });

  it('the summary skips half-typed values instead of failing', () => {
    const s = summarise(validDesign({ basePrices: ['2.49', '', 'x'], ladder: [0.1, 1.5, 0.2] }) as Record<string, unknown>);
    expect(s.bases).toBe(1);
    expect(s.rungs).toBe(2);
  });

  it('offers only the state moves the server allows', () => {
    expect(allowedActions('draft')).toEqual(['launch']);
    expect(allowedActions('live')).toEqual(['pause', 'close']);
    expect(allowedActions('paused')).toEqual(['resume', 'close']);
    expect(allowedActions('closed')).toEqual([]);
  });

  it('recognises pictures by their first bytes', () => {
    expect(sniffPicture(TINY_PNG)).toBe('image/png');
    expect(sniffPicture(new Uint8Array([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg');
    expect(sniffPicture(new Uint8Array([...Buffer.from('RIFF'), 0, 0, 0, 0, ...Buffer.from('WEBPVP8 ')]))).toBe('image/webp');
    expect(sniffPicture(Buffer.from('GIF89a'))).toBeNull();
    expect(sniffPicture(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull();
  });
});
