import type { CheckKey, WorkOrderView } from '../../../../shared/api/work-orders';
import type { AlertView } from '../../../../shared/realtime/envelope';

export const STATUS_WORDS: Record<WorkOrderView['status'], string> = { open: 'Open', inProgress: 'In progress', closed: 'Closed' };
export const OUTCOME_WORDS: Record<NonNullable<WorkOrderView['outcome']>, string> = {
  repaired: 'Repaired',
  noFaultFound: 'No fault found',
  partsOrdered: 'Parts ordered',
  referred: 'Referred to the manufacturer’s service',
  cancelled: 'Cancelled',
};
export const CHECK_WORDS: Record<CheckKey, string> = {
  coilResistance: 'Relay coil resistance, terminals 85–86',
  defFreezeDamage: 'DEF lines and pump: freeze damage',
  isolator: 'Battery isolator',
  indicator: 'Indicator beside the switch',
};
export const VERDICT_WORDS = { pass: 'Pass', fail: 'Fail', low: 'Too low', high: 'Too high' } as const;
export const SOURCE_WORDS = { alert: 'Alert', episode: 'Purge episode', fault: 'Fault' } as const;
export const ALERT_KIND_WORDS: Record<AlertView['kind'], string> = {
  interruptedPurge: 'purge interrupted',
  undeterminedCold: 'purge unconfirmed in the cold',
  contactLost: 'contact lost during a purge',
  forecastFreeze: 'freezing forecast, purge unfinished',
};
