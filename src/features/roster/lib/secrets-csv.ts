import Papa from 'papaparse';
import type { RosterCommitResult } from '../../../../shared/api/roster';

/** The new gateways' secrets as a CSV, written with papaparse (quotes where a cell needs them). */
export function secretsCsv(result: RosterCommitResult): string {
  return Papa.unparse({ fields: ['unit_id', 'gateway_id', 'secret'], data: result.gateways.map((g) => [g.unitId, g.gatewayId, g.secret]) });
}
