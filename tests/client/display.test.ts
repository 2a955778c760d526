import { describe, expect, it } from 'vitest';
import { navFor } from '../../src/app/nav';
import { countStates } from '../../src/features/units/lib/count-states';
import { remainingSeconds } from '../../src/features/units/lib/purge-countdown';
import { LinkSpnsTextSchema, PurgeSecondsSchema } from '../../src/features/units/api/unit-input';
import { formatCountdown, formatDuration } from '../../src/lib/format';
import { UNIT_STATES, STATE_LABELS, stateLabel } from '../../src/lib/unit-state';

describe('the purge countdown', () => {
  // Gateway protocol v1, rule 8: purgeRemainingS is the ceil of the seconds to C, at least 0.
  it('counts down from the fetched value by the time since the fetch, rounding up', () => {
    expect(remainingSeconds(94, 1_000, 1_000)).toBe(94);
    expect(remainingSeconds(94, 1_000, 1_400)).toBe(94);
    expect(remainingSeconds(94, 1_000, 11_000)).toBe(84);
  });
  it('stops at zero and has nothing to show without a purge', () => {
    expect(remainingSeconds(5, 0, 60_000)).toBe(0);
    expect(remainingSeconds(null, 0, 0)).toBeNull();
  });
  it('is written as minutes and seconds', () => {
    expect(formatCountdown(94)).toBe('1:34');
    expect(formatCountdown(0)).toBe('0:00');
    expect(formatCountdown(3600)).toBe('60:00');
  });
});

describe('time in state', () => {
  it('is written with the two largest units', () => {
    expect(formatDuration(38_900)).toBe('38 s');
    expect(formatDuration(249_000)).toBe('4 min 09 s');
    expect(formatDuration(2 * 3600_000 + 5 * 60_000)).toBe('2 h 05 min');
    expect(formatDuration(3 * 86_400_000 + 3600_000)).toBe('3 d 01 h');
    expect(formatDuration(-5_000)).toBe('0 s');
  });
});

describe('state labels', () => {
  it('name the two states a technician waits for as the project words them, and every state differently', () => {
    expect(STATE_LABELS.purging).toBe('Purge in progress');
    expect(STATE_LABELS.safeToIsolate).toBe('Safe to isolate');
    expect(stateLabel(null)).toBe('No data yet');
    expect(new Set(UNIT_STATES.map(stateLabel)).size).toBe(UNIT_STATES.length);
  });
});

describe('profile inputs', () => {
  it('reads linked SPNs from a comma-separated list, dropping repeats; empty means all', () => {
    expect(LinkSpnsTextSchema.parse(' 3216, 91 3216,')).toEqual([3216, 91]);
    expect(LinkSpnsTextSchema.parse('  ')).toBeNull();
  });
  // SAE J1939-73: an SPN is a 19-bit number, 0 to 524287.
  it('refuses an SPN that is not a 19-bit whole number', () => {
    expect(LinkSpnsTextSchema.safeParse('524288').success).toBe(false);
    expect(LinkSpnsTextSchema.safeParse('12.5').success).toBe(false);
    expect(LinkSpnsTextSchema.safeParse('-1').success).toBe(false);
    expect(LinkSpnsTextSchema.safeParse('524287').success).toBe(true);
  });
  // Gateway protocol v1, API details: purgeSeconds is an integer from 10 to 3600.
  it('holds the purge time to whole seconds from 10 to 3600', () => {
    expect([9, 10, 3600, 3601, 12.5, Number.NaN].map((n) => PurgeSecondsSchema.safeParse(n).success)).toEqual([
      false, true, true, false, false, false,
    ]);
  });
});

describe('navigation by role', () => {
  it('shows the admin pages to admins only', () => {
    const adminOnly = ['Users', 'Units & profiles', 'Gateways', 'Audit log', 'Switch codes', 'Roster import', 'Mailbox'];
    expect(navFor('admin').map((i) => i.label)).toEqual(expect.arrayContaining(['Board', 'Alerts', 'Units', ...adminOnly]));
    for (const role of ['monitor', 'planner', 'technician'] as const) {
      const labels = navFor(role).map((i) => i.label);
      expect(labels).toEqual(expect.arrayContaining(['Board', 'Alerts', 'Units', 'Work orders']));
      for (const a of adminOnly) expect(labels).not.toContain(a);
      expect(navFor(role).every((i) => i.group !== 'admin')).toBe(true);
    }
  });
});

describe('counting units by state', () => {
  it('counts every state, with units that have sent nothing under "none"', () => {
    const counts = countStates([{ state: 'purging' }, { state: 'purging' }, { state: null }, { state: 'isolated' }]);
    expect(counts).toEqual({ keyOn: 0, purging: 2, safeToIsolate: 0, isolated: 1, interrupted: 0, noContact: 0, none: 1 });
  });
});
