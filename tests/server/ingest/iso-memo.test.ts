// The unit view's times come through a small table of the last texts made (unit-book.ts): whatever the
// slot a time lands in, the text must be the one ECMAScript's Date.prototype.toISOString gives
// (ECMA-262, Date Time String Format: YYYY-MM-DDTHH:mm:ss.sssZ).
import { describe, expect, it } from 'vitest';
import { isoText } from '../../../server/ingest/unit-book';

describe('the view times table', () => {
  it('gives the same text as toISOString for times that share a slot, in any order', () => {
    const base = Date.UTC(2026, 10, 27, 16, 59, 58, 123);
    const times = [base, base + 4096, base - 4096, base + 4096 * 1000, base, base + 1, base + 4096, 0, 4096, -4096];
    for (let round = 0; round < 3; round++) {
      for (const ms of times) expect(isoText(ms)).toBe(new Date(ms).toISOString());
      times.reverse();
    }
  });

  it('passes null through and refuses a time that is no date, as Date does', () => {
    expect(isoText(null)).toBeNull();
    expect(() => isoText(NaN)).toThrow(RangeError);
    expect(() => isoText(8.64e15 + 1)).toThrow(RangeError);
    // The refused time kept nothing: a good time in the same slot afterwards is still formatted afresh.
    expect(() => isoText(8.64e15 + 4097)).toThrow(RangeError);
    expect(isoText(4097)).toBe(new Date(4097).toISOString());
  });

  it('a known instant (worked example: the Unix epoch plus one day and one millisecond)', () => {
    expect(isoText(86_400_001)).toBe('1970-01-02T00:00:00.001Z');
  });
});
