import { DEF_FREEZE_POINT_C } from '../../shared/protocol/limits';

// The bands are the server's (server/detection/freeze.ts); these are only the words for them.
const WORDS: Record<string, string> = {
  none: 'No freeze exposure',
  watch: 'Watch: near freezing',
  atRisk: 'At risk of freezing',
  frozen: `Probably frozen (at or below ${DEF_FREEZE_POINT_C} °C)`,
};

export function freezeWords(band: string | null | undefined): string {
  if (band === null || band === undefined) return 'Unknown (no ambient reported)';
  return WORDS[band] ?? band;
}
