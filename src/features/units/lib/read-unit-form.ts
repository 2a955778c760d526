import { defaultLossThresholdV } from '../../../../shared/protocol/limits';
import { readNumber, readText } from '../../../lib/form-data';

/** The raw profile values of a unit form; an empty loss threshold means the system's default. */
export function readUnitProfile(form: FormData) {
  const systemVoltage = readNumber(form, 'systemVoltage');
  const threshold = readNumber(form, 'lossThresholdV');
  return {
    name: readText(form, 'name'),
    depot: readText(form, 'depot'),
    systemVoltage,
    purgeSeconds: readNumber(form, 'purgeSeconds'),
    lossThresholdV:
      threshold === undefined && (systemVoltage === 12 || systemVoltage === 24) ? defaultLossThresholdV(systemVoltage) : threshold,
    linkSpns: readText(form, 'linkSpns'),
  };
}
