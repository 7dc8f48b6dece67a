import { describe, expect, it } from 'vitest';
import { answerTimeWords, builderStandingLines, shopStandingLines } from '../../client/components/standing';
import { shareOrNull, STANDING_MIN_COUNT } from '../../shared/standing';

describe('standing figures and their words', () => {
  it('when fewer than the minimum count, then no figure; at the minimum, the count, the total and the share', () => {
    expect(STANDING_MIN_COUNT).toBe(5);
    expect(shareOrNull(4, 4)).toBeNull();
    expect(shareOrNull(4, 5)).toEqual({ count: 4, of: 5, share: 0.8 });
  });

  it('when a figure is missing, then the screen says there is not enough history instead', () => {
    const none = shopStandingLines({ firstTimeAcceptance: null, onTime: null, disputes: null, answerTime: null }).map((l) => l.text);
    expect(none).toEqual(['Not enough finished jobs yet', 'Not enough finished jobs yet', 'Not enough finished jobs yet', 'Not enough answered messages yet']);
    expect(builderStandingLines({ paysOnTime: null, answersRecords: null }).map((l) => l.text)).toEqual(['Not enough awards yet', 'Not enough records yet']);
  });

  it('when figures are there, then each reads with its count', () => {
    const lines = shopStandingLines({
      firstTimeAcceptance: { count: 9, of: 10, share: 0.9 },
      onTime: { count: 7, of: 8, share: 0.875 },
      disputes: { opened: 2, completed: 12, outcomes: { release: 1, refund: 0, split: 0, open: 1 } },
      answerTime: { minutes: 95, of: 14, waiting: 1 },
    }).map((l) => l.text);
    expect(lines).toEqual([
      '9 of 10 records accepted first time',
      '7 of 8 jobs ready or shipped by the due day',
      '2 disputes over 12 completed jobs (1 paid to the shop, 1 still open)',
      'Answers builders in 1 h 35 min (the middle of 14 answers)',
    ]);
  });

  it('when answer times are short, long or very long, then they read in minutes, hours or days', () => {
    expect([answerTimeWords(0), answerTimeWords(45), answerTimeWords(120), answerTimeWords(47 * 60 + 59), answerTimeWords(3 * 24 * 60)]).toEqual(['0 min', '45 min', '2 h', '47 h 59 min', '3 days']);
  });
});
