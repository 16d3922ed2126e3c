// Protects issue 14's "link state follows the study": a link of a closed or paused study never reads "Open".
import { describe, expect, it } from 'vitest';
import { linkStateLabel, STUDY_STATES } from '@/lib/study-states';

describe('link state shown beside each respondent link', () => {
  it('is Open only for an open link of a live study', () => {
    for (const s of STUDY_STATES) {
      expect(linkStateLabel(false, s).takesRespondents).toBe(s === 'live');
      expect(linkStateLabel(true, s)).toEqual({ text: 'Closed', takesRespondents: false });
    }
  });
  it('names why an open link takes nobody', () => {
    expect(linkStateLabel(false, 'closed').text).toBe('Study closed');
    expect(linkStateLabel(false, 'paused').text).toBe('Study paused');
    expect(linkStateLabel(false, 'draft').text).toBe('Opens at launch');
  });
});
