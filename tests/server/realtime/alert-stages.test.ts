// An alert only moves forward (open -> acknowledged -> resolved, each possibly after its escalation):
// a worker shows each stage once and drops a repeated or overtaken one.
import { describe, expect, it } from 'vitest';
import { AlertStages } from '../../../server/realtime/alert-stages';

const at = (id: number, status: 'open' | 'acknowledged' | 'resolved', escalated = false) => ({ id, status, escalatedAt: escalated ? '2026-12-02T05:00:00.000Z' : null });

describe('AlertStages', () => {
  it('takes each stage once, in order, and drops repeats and late ones', () => {
    const s = new AlertStages();
    expect(s.advance(at(1, 'open'))).toBe(true);
    expect(s.advance(at(1, 'open'))).toBe(false);
    expect(s.advance(at(1, 'open', true))).toBe(true); // escalated
    expect(s.advance(at(1, 'acknowledged'))).toBe(true);
    expect(s.advance(at(1, 'open', true))).toBe(false); // late: overtaken
    expect(s.advance(at(1, 'resolved'))).toBe(true);
    expect(s.advance(at(1, 'acknowledged'))).toBe(false);
    expect(s.advance(at(2, 'resolved'))).toBe(true); // another alert is its own
  });

  it('forgets the oldest alerts past its limit, keeping the recently touched ones', () => {
    const s = new AlertStages(3);
    for (const id of [1, 2, 3]) s.advance(at(id, 'open'));
    s.advance(at(1, 'acknowledged')); // 1 becomes the newest
    s.advance(at(4, 'open')); // 2 is forgotten
    expect(s.size).toBe(3);
    expect(s.advance(at(2, 'open'))).toBe(true); // seen afresh
    expect(s.advance(at(1, 'acknowledged'))).toBe(false); // still remembered
  });
});
