// The roster CSV, read with papaparse, checked cell by cell. Pure: the database's existing ids come in as sets.
import Papa from 'papaparse';
import { GATEWAY_ID_PATTERN, MAX_PURGE_SECONDS, MIN_PURGE_SECONDS } from '../../../shared/protocol/limits';
import { ROSTER_COLUMNS, ROSTER_MAX_ROWS, type RosterColumn, type RosterPreview, type RosterRow } from '../../../shared/api/roster';

export interface Existing {
  units: Set<string>;
  /** gateway id -> the unit it belongs to */
  gateways: Map<string, string>;
}

const ID_RULE = '1–64 letters, digits, _ or -, starting with a letter or digit';

export function parseRoster(csv: string, existing: Existing): RosterPreview {
  const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const fileErrors: string[] = [];
  const headers = parsed.meta.fields ?? [];
  const missing = ROSTER_COLUMNS.filter((c) => !headers.includes(c));
  if (missing.length) fileErrors.push(`Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')} (expected: ${ROSTER_COLUMNS.join(', ')})`);
  const unknown = headers.filter((h) => !(ROSTER_COLUMNS as readonly string[]).includes(h));
  if (unknown.length) fileErrors.push(`Unknown column${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}`);
  if (parsed.data.length > ROSTER_MAX_ROWS) fileErrors.push(`Too many rows: ${parsed.data.length} (at most ${ROSTER_MAX_ROWS} per file)`);
  if (parsed.data.length === 0 && !missing.length) fileErrors.push('The file has a header but no rows');
  if (fileErrors.length) return { ok: false, rows: [], fileErrors, errorCount: fileErrors.length };

  // A data row's line in the file: papaparse counts rows after the header; blank lines were skipped,
  // so the line is recovered from the row's cursor position.
  const lineOf = lineCounter(csv);
  const rowErrorsByIndex = new Map<number, string[]>();
  for (const e of parsed.errors) if (e.row !== undefined) rowErrorsByIndex.set(e.row, [...(rowErrorsByIndex.get(e.row) ?? []), e.message]);

  const seenUnits = new Map<string, number>();
  const seenGateways = new Map<string, number>();
  const rows: RosterRow[] = parsed.data.map((raw, i) => {
    const cell = (c: RosterColumn) => (raw[c] ?? '').trim();
    const errors: RosterRow['errors'] = (rowErrorsByIndex.get(i) ?? []).map((message) => ({ column: null, message: `CSV: ${message}` }));
    const err = (column: RosterColumn, message: string) => errors.push({ column, message });
    const line = lineOf(i);

    const unitId = cell('unit_id');
    if (!GATEWAY_ID_PATTERN.test(unitId)) err('unit_id', unitId ? `"${unitId}" is not a valid unit id (${ID_RULE})` : 'unit id is empty');
    else if (seenUnits.has(unitId)) err('unit_id', `unit ${unitId} is also on line ${seenUnits.get(unitId)} of this file`);
    else if (existing.units.has(unitId)) err('unit_id', `unit ${unitId} already exists`);
    if (!seenUnits.has(unitId)) seenUnits.set(unitId, line);

    const name = cell('name');
    if (!name) err('name', 'name is empty');
    else if (name.length > 120) err('name', 'name is longer than 120 characters');
    const depot = cell('depot');
    if (!depot) err('depot', 'depot is empty');
    else if (depot.length > 120) err('depot', 'depot is longer than 120 characters');

    const volts = cell('system_voltage').replace(/\s*v$/i, '');
    const systemVoltage = volts === '12' ? 12 : volts === '24' ? 24 : null;
    if (systemVoltage === null) err('system_voltage', `system voltage must be 12 or 24, got "${cell('system_voltage')}"`);

    const purgeText = cell('purge_seconds');
    let purgeSeconds: number | null = null;
    if (purgeText === '') purgeSeconds = null;
    else if (!/^\d+$/.test(purgeText)) err('purge_seconds', `purge time must be whole seconds, got "${purgeText}"`);
    else {
      purgeSeconds = Number(purgeText);
      if (purgeSeconds < MIN_PURGE_SECONDS || purgeSeconds > MAX_PURGE_SECONDS) err('purge_seconds', `purge time must be ${MIN_PURGE_SECONDS}–${MAX_PURGE_SECONDS} s, got ${purgeSeconds}`);
    }

    const gw = cell('gateway_id');
    const gatewayId = gw === '' ? null : gw;
    if (gatewayId !== null) {
      if (!GATEWAY_ID_PATTERN.test(gatewayId)) err('gateway_id', `"${gatewayId}" is not a valid gateway id (${ID_RULE})`);
      else if (seenGateways.has(gatewayId)) err('gateway_id', `gateway ${gatewayId} is also on line ${seenGateways.get(gatewayId)} of this file`);
      else if (existing.gateways.has(gatewayId)) err('gateway_id', `gateway ${gatewayId} already exists (unit ${existing.gateways.get(gatewayId)})`);
      if (!seenGateways.has(gatewayId)) seenGateways.set(gatewayId, line);
    }
    const cells = Object.fromEntries(ROSTER_COLUMNS.map((c) => [c, cell(c)])) as Record<RosterColumn, string>;
    return { line, unitId, name, depot, systemVoltage, purgeSeconds, gatewayId, cells, errors };
  });
  const errorCount = rows.reduce((n, r) => n + r.errors.length, 0);
  return { ok: errorCount === 0, rows, fileErrors: [], errorCount };
}

/** Maps the i-th non-empty data row to its 1-based line in the file (line 1 is the header). */
function lineCounter(csv: string) {
  const lines = csv.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const dataLines: number[] = [];
  // Quoted cells may span lines: count only lines that start a record, judged by balanced quotes.
  let inQuotes = false;
  let headerDone = false;
  lines.forEach((text, idx) => {
    const startsRecord = !inQuotes;
    const quotes = (text.match(/"/g) ?? []).length;
    if (quotes % 2 === 1) inQuotes = !inQuotes;
    if (!startsRecord) return;
    if (!headerDone) {
      headerDone = true;
      return;
    }
    if (text.trim() !== '' && text.replace(/[,\s]/g, '') !== '') dataLines.push(idx + 1);
  });
  return (i: number) => dataLines[i] ?? i + 2;
}
