// State of charge of a rested lead-acid battery from its open-circuit voltage. Pure, no I/O.

/**
 * BCI open-circuit voltage table at 26.7 °C (80 °F), 12 V battery, as given in issue 6:
 * 12.65 / 12.45 / 12.24 / 12.06 / 11.89 V for 100 / 75 / 50 / 25 / 0 % state of charge.
 * The table is for a rested battery (no charge or heavy load for some hours) near room temperature;
 * colder electrolyte reads a little lower, so a cold reading errs towards a lower state of charge.
 */
export const BCI_OCV_TABLE_12V: readonly { volts: number; soc: number }[] = [
  { volts: 11.89, soc: 0 },
  { volts: 12.06, soc: 25 },
  { volts: 12.24, soc: 50 },
  { volts: 12.45, soc: 75 },
  { volts: 12.65, soc: 100 },
];

export type SystemVoltage = 12 | 24;

/** A 24 V system is two 12 V batteries in series, so its table is the 12 V table doubled (as given in issue 6). */
export function ocvTable(system: SystemVoltage) {
  const k = system === 24 ? 2 : 1;
  return BCI_OCV_TABLE_12V.map((p) => ({ volts: p.volts * k, soc: p.soc }));
}

/** State of charge in percent, linear between the table's points and clamped to 0..100 outside them. */
export function stateOfCharge(volts: number, system: SystemVoltage): number {
  if (!Number.isFinite(volts)) throw new RangeError(`volts must be a finite number, got ${volts}`);
  if (system !== 12 && system !== 24) throw new RangeError(`system voltage must be 12 or 24, got ${system}`);
  const table = ocvTable(system);
  if (volts <= table[0].volts) return 0;
  const last = table[table.length - 1];
  if (volts >= last.volts) return 100;
  for (let i = 1; i < table.length; i++) {
    const hi = table[i];
    if (volts <= hi.volts) {
      const lo = table[i - 1];
      return lo.soc + ((volts - lo.volts) / (hi.volts - lo.volts)) * (hi.soc - lo.soc);
    }
  }
  return 100;
}
