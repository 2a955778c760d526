import { useState } from 'react';
import { SelectField, TextField } from '../../../components/ui/field';
import { DEFAULT_PURGE_SECONDS, MAX_PURGE_SECONDS, MIN_PURGE_SECONDS, defaultLossThresholdV } from '../../../../shared/protocol/limits';

export interface ProfileDefaults {
  name?: string;
  depot?: string;
  systemVoltage?: 12 | 24;
  purgeSeconds?: number;
  lossThresholdV?: number | null;
  linkSpns?: number[] | null;
}

/** The profile inputs shared by "create a unit" and "edit a profile"; values are read from the form. */
export function UnitProfileFields({ defaults = {}, errors }: { defaults?: ProfileDefaults; errors: Record<string, string> }) {
  const [voltage, setVoltage] = useState<12 | 24>(defaults.systemVoltage ?? 24);
  return (
    <>
      <TextField label="Name" name="name" defaultValue={defaults.name} error={errors.name} />
      <TextField label="Depot" name="depot" defaultValue={defaults.depot} error={errors.depot} />
      <SelectField
        label="System voltage"
        name="systemVoltage"
        value={String(voltage)}
        onChange={(e) => setVoltage(e.target.value === '12' ? 12 : 24)}
        options={[
          { value: '12', label: '12 V' },
          { value: '24', label: '24 V' },
        ]}
        error={errors.systemVoltage}
      />
      <TextField
        label="Purge time (s)"
        name="purgeSeconds"
        type="number"
        inputMode="numeric"
        min={MIN_PURGE_SECONDS}
        max={MAX_PURGE_SECONDS}
        step={1}
        defaultValue={defaults.purgeSeconds ?? DEFAULT_PURGE_SECONDS}
        hint={`${MIN_PURGE_SECONDS} to ${MAX_PURGE_SECONDS} s. Take it from the engine maker's documentation.`}
        error={errors.purgeSeconds}
      />
      <TextField
        label="Loss threshold (V)"
        name="lossThresholdV"
        type="number"
        inputMode="decimal"
        step={0.1}
        defaultValue={defaults.lossThresholdV ?? undefined}
        placeholder={`${defaultLossThresholdV(voltage).toFixed(1)} (default for ${voltage} V)`}
        hint="Supply below this counts as power lost."
        error={errors.lossThresholdV}
      />
      <TextField
        label="Linked SPNs"
        name="linkSpns"
        defaultValue={defaults.linkSpns?.join(', ') ?? ''}
        placeholder="All SPNs"
        hint="Comma-separated. Only these faults are linked to an interrupted purge; empty links all."
        error={errors.linkSpns}
      />
    </>
  );
}
