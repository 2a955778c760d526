// What an alert mail says. Pure.
import type { AlertView } from '../../../shared/realtime/envelope';

export type MailReason = 'raised' | 'escalated';

const KIND_TEXT: Record<AlertView['kind'], string> = {
  interruptedPurge: 'DEF purge interrupted',
  undeterminedCold: 'Purge not confirmed in cold weather',
  contactLost: 'Contact lost during the purge',
  forecastFreeze: 'Freezing weather ahead with an unfinished purge',
};

const EXPOSURE_TEXT: Record<string, string> = {
  none: 'no freezing weather seen so far',
  watch: 'near freezing: worth a look',
  atRisk: 'close to the DEF freezing point (about −11 °C, ISO 22241-1)',
  frozen: 'at or under the DEF freezing point: the lines have probably frozen',
};

export const MAIL_CAUTION =
  'Caution: isolate the battery before working on the circuit. The vehicle and engine manufacturers\' procedures, your workshop\'s rules and local regulations prevail over this message.';

export function composeAlertMail(alert: AlertView, reason: MailReason): { subject: string; text: string } {
  const what = KIND_TEXT[alert.kind] ?? alert.kind;
  const subject = `${reason === 'escalated' ? '[Escalated] ' : ''}${what}: ${alert.unitId} at ${alert.depot}`;
  const lines = [
    `${what} on unit ${alert.unitId} (depot ${alert.depot}).`,
    `Raised: ${alert.raisedAt}`,
    reason === 'escalated' ? `Escalated: nobody acknowledged it since ${alert.raisedAt}.` : null,
    alert.secondsIntoPurge !== null ? `The supply was lost ${alert.secondsIntoPurge.toFixed(0)} s into the purge.` : null,
    alert.ambientC !== null ? `Air at key-off: ${alert.ambientC.toFixed(1)} °C.` : null,
    alert.freezeExposure ? `Freeze exposure: ${EXPOSURE_TEXT[alert.freezeExposure] ?? alert.freezeExposure}.` : null,
    alert.comment ? `Note: ${alert.comment}` : null,
    '',
    'Next step: have the driver switch on and let the purge run to the end before isolating.',
    '',
    MAIL_CAUTION,
    '',
    `Alert ${alert.id} · you receive this because you subscribed to depot ${alert.depot} in Afterwatch.`,
  ];
  return { subject, text: lines.filter((l) => l !== null).join('\n') };
}
