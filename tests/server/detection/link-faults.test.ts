import { describe, expect, it } from 'vitest';
import { linkFaults } from '../../../server/detection/link-faults';
import { at, judge, keyedOff } from './builders';

// Gateway protocol v1, precise rule 10: a fault from the first key-on sample after an interrupted
// episode's endedAt to 10 minutes after it (both inclusive) links to that episode; the most recent
// episode wins where two qualify; linkSpns narrows linking to those SPNs. SPNs here are invented.

/** Two interruptions whose next key-ons are `gapS` apart, with a completed purge before them. */
function twoInterruptions(secondKeyOnS: number) {
  const g = keyedOff();
  g.off(130); // completed: never linked
  g.on(500);
  g.off(600);
  g.lost(638); // interrupted A
  g.boot(1000, { atS: 638, cause: 'supply-lost' });
  g.on(1010); // A's next key-on: window [1010, 1610]
  g.off(1100);
  g.lost(1130); // interrupted B
  g.boot(secondKeyOnS - 10, { atS: 1130, cause: 'supply-lost' });
  g.on(secondKeyOnS); // B's next key-on
  return judge(g.events).episodes;
}

describe('linking faults to the interrupted purge that explains them (protocol rule 10)', () => {
  const apart = twoInterruptions(6010);
  const overlapping = twoInterruptions(1250);

  it('the scenario has one completed and two interrupted episodes with their next key-ons', () => {
    expect(apart.map((e) => [e.outcome, e.nextKeyOnAt])).toEqual([
      ['completed', null],
      ['interrupted', at(1010)],
      ['interrupted', at(6010)],
    ]);
  });

  it.each([
    { name: 'a fault before the first key-on after the interruption is not linked', atS: 1009.999, linked: null },
    { name: 'a fault at the first key-on sample is linked (inclusive)', atS: 1010, linked: 1 },
    { name: 'a fault 10 minutes after the key-on is linked (inclusive)', atS: 1610, linked: 1 },
    { name: 'a fault 1 ms later is not linked', atS: 1610.001, linked: null },
    { name: 'a fault after the second interruption links to it', atS: 6500, linked: 2 },
    { name: 'a fault before any interruption is not linked', atS: 200, linked: null },
  ])('$name', ({ atS, linked }) => {
    expect(linkFaults(apart, [{ at: at(atS), spn: 4001 }])).toEqual([linked]);
  });

  it('where two interrupted episodes qualify, the most recent one wins', () => {
    const faults = [1100, 1250, 1610, 1850, 1850.001].map((s) => ({ at: at(s), spn: 4001 }));
    expect(linkFaults(overlapping, faults)).toEqual([1, 2, 2, 2, null]);
  });

  it('linkSpns narrows linking to the listed SPNs; null or absent allows every SPN', () => {
    const faults = [{ at: at(1200), spn: 4001 }, { at: at(1200), spn: 4002 }];
    expect(linkFaults(apart, faults, [4002])).toEqual([null, 1]);
    expect(linkFaults(apart, faults, null)).toEqual([1, 1]);
    expect(linkFaults(apart, faults)).toEqual([1, 1]);
    expect(linkFaults(apart, faults, [])).toEqual([null, null]);
  });

  it('an interrupted episode with no key-on yet links nothing', () => {
    const g = keyedOff();
    g.lost(20);
    expect(linkFaults(judge(g.events).episodes, [{ at: at(30), spn: 4001 }])).toEqual([null]);
  });

  it.each([
    { name: 'a fault time that is not a number', faults: [{ at: Number.NaN, spn: 1 }], spns: null },
    { name: 'an SPN over 19 bits (SAE J1939-73)', faults: [{ at: at(0), spn: 524_288 }], spns: null },
    { name: 'a fractional SPN in linkSpns', faults: [], spns: [1.5] },
  ])('$name is refused', ({ faults, spns }) => {
    expect(() => linkFaults(apart, faults, spns)).toThrow(RangeError);
  });
});
