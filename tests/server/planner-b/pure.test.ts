// The pure parts of the planner's desk B: forecast lows and warnings, digest slots, mail decoding, roster lines.
import { describe, expect, it } from 'vitest';
import { lowAhead, needsForecastWarning } from '../../../server/modules/forecast/lows';
import { digestSlot } from '../../../server/modules/mail/digest';
import { decodeEncodedWords, decodeMail } from '../../../server/dev-fakes/mime-text';
import { parseRoster } from '../../../server/modules/roster/parse';
import { DEF_FREEZE_POINT_C } from '../../../shared/protocol/limits';

const at = (iso: string) => new Date(iso);
const hourly = (startIso: string, temps: number[]) => temps.map((c, i) => ({ at: new Date(at(startIso).getTime() + i * 3600_000), c }));

describe('forecast low ahead', () => {
  it('looks from the current hour to 48 h ahead and finds the first hour at or under -11 °C (ISO 22241-1)', () => {
    expect(DEF_FREEZE_POINT_C).toBe(-11);
    const temps = Array.from({ length: 72 }, (_, h) => (h === 1 ? -30 : h === 20 ? -11 : h === 30 ? -12.5 : h === 60 ? -40 : 0));
    const low = lowAhead(hourly('2026-12-02T00:00:00Z', temps), at('2026-12-02T02:30:00Z'))!;
    // Hour 1 is past, hour 60 is beyond 02:30 + 48 h = hour 50.5.
    expect(low.lowC).toBe(-12.5);
    expect(low.lowAt.toISOString()).toBe('2026-12-03T06:00:00.000Z');
    expect(low.freezeFrom!.toISOString()).toBe('2026-12-02T20:00:00.000Z');
    expect(low.hours[0].at.toISOString()).toBe('2026-12-02T02:00:00.000Z');
  });
  it('a low of -10.9 °C is not a freeze; no hours ahead gives no low', () => {
    expect(lowAhead(hourly('2026-12-02T00:00:00Z', [-10.9, -10.9]), at('2026-12-02T00:10:00Z'))!.freezeFrom).toBeNull();
    expect(lowAhead(hourly('2026-11-20T00:00:00Z', [-20]), at('2026-12-02T00:00:00Z'))).toBeNull();
  });
  it('warns only parked units whose latest purge is pending, undetermined or interrupted', () => {
    const freeze = lowAhead(hourly('2026-12-02T00:00:00Z', [-15]), at('2026-12-02T00:00:00Z'));
    const mild = lowAhead(hourly('2026-12-02T00:00:00Z', [-5]), at('2026-12-02T00:00:00Z'));
    expect(needsForecastWarning('interrupted', 'interrupted', freeze)).toBe(true);
    expect(needsForecastWarning('purging', 'pending', freeze)).toBe(true);
    expect(needsForecastWarning('noContact', 'undetermined', freeze)).toBe(true);
    expect(needsForecastWarning('keyOn', 'interrupted', freeze)).toBe(false);
    expect(needsForecastWarning('safeToIsolate', 'completed', freeze)).toBe(false);
    expect(needsForecastWarning('isolated', 'resumed', freeze)).toBe(false);
    expect(needsForecastWarning(null, 'interrupted', freeze)).toBe(false);
    expect(needsForecastWarning('interrupted', 'interrupted', mild)).toBe(false);
  });
});

describe('weekly digest slot', () => {
  it('falls due on the configured weekday and hour (UTC), once per week', () => {
    // 2026-11-30 is a Monday (ISO 8601 weeks start on Monday).
    expect(digestSlot(at('2026-11-30T05:59:00Z'), 1, 6)).toBeNull();
    expect(digestSlot(at('2026-11-30T06:00:00Z'), 1, 6)).toBe('week-of-2026-11-30');
    expect(digestSlot(at('2026-12-06T23:00:00Z'), 1, 6)).toBe('week-of-2026-11-30');
    expect(digestSlot(at('2026-12-03T10:00:00Z'), 5, 6)).toBeNull();
  });
});

describe('mail decoding (RFC 2045 / RFC 2047)', () => {
  it('decodes encoded words and quoted-printable bodies', () => {
    expect(decodeEncodedWords('=?UTF-8?Q?Ambient_=E2=88=9214_=C2=B0C?=')).toBe('Ambient −14 °C');
    expect(decodeEncodedWords('=?UTF-8?B?R3LDtsOfZQ==?=')).toBe('Größe');
    const raw = 'Subject: =?UTF-8?Q?a?=\r\n =?UTF-8?Q?b?=\r\nTo: x@test.local\r\nContent-Type: text/plain; charset=utf-8\r\nContent-Transfer-Encoding: quoted-printable\r\n\r\nGr=C3=B6=C3=9Fe=\r\n ok\r\n';
    expect(decodeMail(raw)).toEqual({ subject: 'ab', from: null, to: 'x@test.local', text: 'Größe ok' });
  });
});

describe('roster lines', () => {
  it('reports the file line of a row after blank lines and a quoted cell spanning lines', () => {
    const csv = 'unit_id,name,depot,system_voltage,purge_seconds,gateway_id\n\nA-1,"two\nlines",D,12,120,\n\nB-1,x,D,36,120,\n';
    const p = parseRoster(csv, { units: new Set(), gateways: new Map() });
    expect(p.rows.map((r) => r.line)).toEqual([3, 6]);
    expect(p.rows[0].name).toBe('two\nlines');
    expect(p.rows[1].errors).toEqual([{ column: 'system_voltage', message: 'system voltage must be 12 or 24, got "36"' }]);
  });
});
