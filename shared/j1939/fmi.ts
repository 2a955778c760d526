// Failure mode identifiers 0..31 (SAE J1939-73, FMI table). The meanings follow the standard;
// the wording is our own plain English, written from memory, not quoted from the standard.
const DESCRIPTIONS: readonly string[] = [
  /* 0 */ 'Value valid but above the normal range (most severe level)',
  /* 1 */ 'Value valid but below the normal range (most severe level)',
  /* 2 */ 'Value erratic, intermittent or incorrect',
  /* 3 */ 'Voltage above normal, or shorted to a high source',
  /* 4 */ 'Voltage below normal, or shorted to a low source',
  /* 5 */ 'Current below normal, or open circuit',
  /* 6 */ 'Current above normal, or grounded circuit',
  /* 7 */ 'Mechanical system not responding or out of adjustment',
  /* 8 */ 'Abnormal frequency, pulse width or period',
  /* 9 */ 'Abnormal update rate',
  /* 10 */ 'Abnormal rate of change',
  /* 11 */ 'Root cause not known',
  /* 12 */ 'Faulty intelligent device or component',
  /* 13 */ 'Out of calibration',
  /* 14 */ 'Special instructions apply',
  /* 15 */ 'Value valid but above the normal range (least severe level)',
  /* 16 */ 'Value valid but above the normal range (moderately severe level)',
  /* 17 */ 'Value valid but below the normal range (least severe level)',
  /* 18 */ 'Value valid but below the normal range (moderately severe level)',
  /* 19 */ 'Network data received in error',
  /* 20 */ 'Value has drifted high',
  /* 21 */ 'Value has drifted low',
  /* 22 */ 'Reserved for future assignment',
  /* 23 */ 'Reserved for future assignment',
  /* 24 */ 'Reserved for future assignment',
  /* 25 */ 'Reserved for future assignment',
  /* 26 */ 'Reserved for future assignment',
  /* 27 */ 'Reserved for future assignment',
  /* 28 */ 'Reserved for future assignment',
  /* 29 */ 'Reserved for future assignment',
  /* 30 */ 'Reserved for future assignment',
  /* 31 */ 'Condition exists (no further detail)',
];

/** The highest FMI: the field is 5 bits wide (SAE J1939-73). */
export const MAX_FMI = 31;

/** Every FMI with its description, in order 0..31. */
export const FMI_DESCRIPTIONS: readonly { fmi: number; description: string }[] = DESCRIPTIONS.map((description, fmi) => ({
  fmi,
  description,
}));

/** True for FMIs the standard leaves unassigned (22..30, from memory). */
export function isReservedFmi(fmi: number): boolean {
  return Number.isInteger(fmi) && fmi >= 22 && fmi <= 30;
}

/** A short description of an FMI; throws RangeError for anything but an integer 0..31. */
export function describeFmi(fmi: number): string {
  if (!Number.isInteger(fmi) || fmi < 0 || fmi > MAX_FMI) throw new RangeError(`FMI ${fmi} is not an integer 0..31`);
  return DESCRIPTIONS[fmi];
}
