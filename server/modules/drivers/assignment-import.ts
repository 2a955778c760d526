// The assignments CSV: parse (papaparse), check every cell, preview, and commit all rows or none.
import Papa from 'papaparse';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { AppError, badRequest, validationError } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';
import { UnitIdSchema } from '../../../shared/api/units';
import { ASSIGNMENT_CSV_COLUMNS, ASSIGNMENT_TEMPLATE, DriverCodeSchema, DriverNameSchema, MAX_IMPORT_ROWS, ZonedTimeSchema, type ImportPreview, type ImportRow } from '../../../shared/api/drivers';
import { insertAssignment, lockAssignments, overlapping } from './service';

export { ASSIGNMENT_TEMPLATE };

interface Parsed { line: number; cells: Record<string, string>; parseError: string | null }

function parse(csv: string): Parsed[] {
  const result = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const fields = result.meta.fields ?? [];
  const missing = ASSIGNMENT_CSV_COLUMNS.filter((c) => c !== 'to' && c !== 'driver_name' && !fields.includes(c));
  const unknown = fields.filter((f) => !(ASSIGNMENT_CSV_COLUMNS as readonly string[]).includes(f));
  if (missing.length || unknown.length)
    throw validationError(`The header row must be: ${ASSIGNMENT_CSV_COLUMNS.join(',')}`, { missing, unknown });
  if (result.data.length === 0) throw badRequest('The file has a header but no rows');
  if (result.data.length > MAX_IMPORT_ROWS) throw badRequest(`At most ${MAX_IMPORT_ROWS} rows per file; this one has ${result.data.length}`);
  const rowErrors = new Map<number, string>();
  for (const e of result.errors) if (e.row !== undefined) rowErrors.set(e.row, e.message);
  // Header is line 1; without quoted line breaks, data row i is line i + 2.
  return result.data.map((cells, i) => ({ line: i + 2, cells, parseError: rowErrors.get(i) ?? null }));
}

const issue = (r: { success: boolean; error?: { issues: { message: string }[] } }) => (r.success ? null : r.error!.issues[0].message);

async function check(db: Sequelize, parsed: Parsed[], tx?: Transaction): Promise<(ImportRow & { from_: Date | null; to_: Date | null; knownId: number | null })[]> {
  const drivers = new Map(
    (await db.query<{ id: number; code: string; name: string }>(`SELECT id, code, name FROM drivers`, { type: QueryTypes.SELECT, transaction: tx })).map((d) => [d.code.toLowerCase(), d]),
  );
  const units = new Set((await db.query<{ id: string }>(`SELECT id FROM units`, { type: QueryTypes.SELECT, transaction: tx })).map((u) => u.id));
  const newNames = new Map<string, string>();
  const out = [];
  for (const p of parsed) {
    const c = (k: string) => (p.cells[k] ?? '').trim();
    const errors: ImportRow['errors'] = [];
    if (p.parseError) errors.push({ column: '(row)', message: p.parseError });
    const code = c('driver_code');
    const name = c('driver_name');
    const codeErr = issue(DriverCodeSchema.safeParse(code));
    if (codeErr) errors.push({ column: 'driver_code', message: code ? codeErr : 'is required' });
    const known = drivers.get(code.toLowerCase());
    const newDriver = !codeErr && !known;
    if (newDriver) {
      const earlier = newNames.get(code.toLowerCase());
      if (!name && !earlier) errors.push({ column: 'driver_name', message: `is required for a new driver (${code} is not on file)` });
      else if (name && issue(DriverNameSchema.safeParse(name))) errors.push({ column: 'driver_name', message: issue(DriverNameSchema.safeParse(name))! });
      else if (name && earlier && earlier !== name) errors.push({ column: 'driver_name', message: `differs from "${earlier}" given for ${code} above` });
      else if (name) newNames.set(code.toLowerCase(), name);
    } else if (known && name && name !== known.name) errors.push({ column: 'driver_name', message: `${code} is on file as "${known.name}"` });
    const unitId = c('unit_id');
    if (!unitId) errors.push({ column: 'unit_id', message: 'is required' });
    else if (issue(UnitIdSchema.safeParse(unitId))) errors.push({ column: 'unit_id', message: issue(UnitIdSchema.safeParse(unitId))! });
    else if (!units.has(unitId)) errors.push({ column: 'unit_id', message: `no unit ${unitId}` });
    const fromP = ZonedTimeSchema.safeParse(c('from'));
    if (!c('from')) errors.push({ column: 'from', message: 'is required' });
    else if (!fromP.success) errors.push({ column: 'from', message: issue(fromP)! });
    const toP = c('to') ? ZonedTimeSchema.safeParse(c('to')) : null;
    if (toP && !toP.success) errors.push({ column: 'to', message: issue(toP)! });
    const from_ = fromP.success ? fromP.data : null;
    const to_ = toP?.success ? toP.data : null;
    if (from_ && to_ && to_ <= from_) errors.push({ column: 'to', message: 'must be after from' });
    out.push({ line: p.line, driverCode: code, driverName: name || known?.name || newNames.get(code.toLowerCase()) || '', unitId, from: c('from'), to: c('to'), newDriver, errors, from_, to_, knownId: known?.id ?? null });
  }
  await checkOverlaps(db, out, tx);
  return out;
}

/** Overlaps between rows of the file, and with assignments already on file, are errors on the row's from. */
async function checkOverlaps(db: Sequelize, rows: { line: number; unitId: string; from_: Date | null; to_: Date | null; errors: ImportRow['errors'] }[], tx?: Transaction) {
  const end = (d: Date | null) => (d ? d.getTime() : Infinity);
  const ok = rows.filter((r) => r.errors.length === 0 && r.from_);
  for (const r of ok) {
    const other = ok.find((o) => o !== r && o.unitId === r.unitId && o.from_!.getTime() < end(r.to_) && end(o.to_) > r.from_!.getTime());
    if (other) r.errors.push({ column: 'from', message: `overlaps line ${other.line} for ${r.unitId}` });
    const clash = await overlapping(db, r.unitId, r.from_!, r.to_, tx);
    if (clash) r.errors.push({ column: 'from', message: `overlaps ${clash.driver_name}'s assignment of ${r.unitId} from ${clash.from_at.toISOString()}` });
  }
}

const preview = (rows: ImportRow[], committed: boolean, created: number): ImportPreview => ({
  rows: rows.map(({ line, driverCode, driverName, unitId, from, to, newDriver, errors }) => ({ line, driverCode, driverName, unitId, from, to, newDriver, errors })),
  errorCount: rows.reduce((n, r) => n + r.errors.length, 0),
  committed,
  created,
});

export async function importAssignments(db: Sequelize, actor: AuthUser, csv: string, commit: boolean): Promise<ImportPreview> {
  const parsed = parse(csv);
  if (!commit) return preview(await check(db, parsed), false, 0);
  return db.transaction(async (tx) => {
    await lockAssignments(db, tx);
    const rows = await check(db, parsed, tx);
    const result = preview(rows, false, 0);
    // All or nothing: with any error nothing is written (the transaction has only read so far).
    if (result.errorCount > 0) throw new AppError('import_rejected', 422, `${result.errorCount} error(s) in the file: nothing was imported`, result);
    const ids = new Map<string, number>();
    for (const r of rows) {
      const key = r.driverCode.toLowerCase();
      if (r.knownId) ids.set(key, r.knownId);
      if (!ids.has(key)) {
        const [d] = await db.query<{ id: number }>(
          `INSERT INTO drivers (code, name) VALUES ($1, $2) RETURNING id`,
          { bind: [r.driverCode, r.driverName], type: QueryTypes.SELECT, transaction: tx },
        );
        ids.set(key, d.id);
      }
      await insertAssignment(db, { driverId: ids.get(key)!, unitId: r.unitId, from: r.from_!, to: r.to_ }, tx);
    }
    await recordAudit(actor, 'assignment.import', 'driver_assignments', { rows: rows.length, newDrivers: rows.filter((r) => r.newDriver).length }, tx);
    return preview(rows, true, rows.length);
  });
}
