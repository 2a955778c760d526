// Streams a filtered query as CSV, batch by batch, inside one REPEATABLE READ snapshot so that
// rows arriving meanwhile neither shift the pages nor appear twice.
import Papa from 'papaparse';
import type { Response } from 'express';
import { Transaction, type Sequelize } from 'sequelize';
import type { Logger } from 'pino';

/** Rows per query while streaming: small enough to keep memory flat, large enough to keep round trips few. */
export const CSV_BATCH = 1000;

export async function streamCsv<T>(
  res: Response,
  opts: {
    sequelize: Sequelize;
    filename: string;
    columns: [string, (row: T) => string | number | null][];
    page: (limit: number, offset: number, transaction: Transaction) => Promise<T[]>;
    log: Logger;
    batch?: number;
  },
) {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${opts.filename}"`);
  const batch = opts.batch ?? CSV_BATCH;
  const header = opts.columns.map(([h]) => h);
  // RFC 4180: CRLF line ends, fields with comma, quote or line break quoted, quotes doubled (papaparse does this).
  // escapeFormulae: a text cell starting with = + - @ is prefixed with ' so a spreadsheet does not run it.
  const unparse = (data: unknown[][]) => Papa.unparse(data, { newline: '\r\n', escapeFormulae: true });
  const write = async (chunk: string) => {
    if (!res.write(chunk)) await new Promise<void>((r) => res.once('drain', () => r()));
  };
  try {
    await opts.sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true }, async (tx) => {
      await write(unparse([header]) + '\r\n');
      for (let offset = 0; ; offset += batch) {
        const rows = await opts.page(batch, offset, tx);
        if (rows.length) await write(unparse(rows.map((r) => opts.columns.map(([, v]) => v(r) ?? ''))) + '\r\n');
        if (rows.length < batch || res.destroyed) break;
      }
    });
    res.end();
  } catch (err) {
    opts.log.error({ err }, 'CSV export failed part-way');
    res.destroy(err as Error);
  }
}
