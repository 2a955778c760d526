// The CSV stream over real PostgreSQL and a real HTTP response: batches joined without loss or repeats,
// RFC 4180 quoting, one snapshot for the whole export.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import express from 'express';
import request from 'supertest';
import Papa from 'papaparse';
import { QueryTypes } from 'sequelize';
import { createTestDatabase } from '../../helpers/test-db';
import { connectDb } from '../../../server/db/index';
import { logger } from '../../../server/lib/logger';
import { streamCsv } from '../../../server/modules/history/csv-stream';

let db: Awaited<ReturnType<typeof connectDb>>;
let drop: () => Promise<void>;
const app = express();

beforeAll(async () => {
  const t = await createTestDatabase();
  drop = t.drop;
  db = await connectDb(t.url, { poolMax: 4 });
  await db.sequelize.query(`CREATE TABLE csv_rows (n integer PRIMARY KEY, label text)`);
  // Labels with the characters RFC 4180 says must be quoted: comma, double quote, CR/LF.
  await db.sequelize.query(`INSERT INTO csv_rows SELECT g, CASE g % 4 WHEN 0 THEN 'plain ' || g WHEN 1 THEN 'a, b' WHEN 2 THEN 'say "hi"' ELSE E'two\\r\\nlines' END FROM generate_series(1, 23) g`);
  app.get('/rows.csv', async (req, res) => {
    await streamCsv<{ n: number; label: string }>(res, {
      sequelize: db.sequelize, filename: 'rows.csv', log: logger('test'), batch: Number(req.query.batch),
      columns: [['n', (r) => r.n], ['label', (r) => r.label]],
      page: async (limit, offset, transaction) => {
        const rows = await db.sequelize.query<{ n: number; label: string }>(`SELECT n, label FROM csv_rows ORDER BY n LIMIT $1 OFFSET $2`, { bind: [limit, offset], type: QueryTypes.SELECT, transaction });
        // A row added by someone else mid-export is not in this export's snapshot.
        if (offset === 0) await db.sequelize.query(`INSERT INTO csv_rows VALUES (0, 'arrived late') ON CONFLICT DO NOTHING`);
        return rows;
      },
    });
  });
});
afterAll(async () => {
  await db?.close();
  await drop?.();
});

describe('streaming CSV', () => {
  for (const batch of [5, 23, 1000])
    it(`batches of ${batch}: every row once, in order, quoted per RFC 4180, from one snapshot`, async () => {
      await db.sequelize.query(`DELETE FROM csv_rows WHERE n = 0`);
      const res = await request(app).get(`/rows.csv?batch=${batch}`).expect(200);
      expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
      expect(res.text.startsWith('n,label\r\n')).toBe(true);
      expect(res.text).toContain('\r\n2,"say ""hi"""\r\n');
      expect(res.text).toContain('\r\n3,"two\r\nlines"\r\n');
      expect(res.text).toContain('\r\n1,"a, b"\r\n');
      const parsed = Papa.parse<{ n: string; label: string }>(res.text, { header: true, skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.data.map((r) => Number(r.n))).toEqual(Array.from({ length: 23 }, (_, i) => i + 1));
      expect(parsed.data[2].label).toBe('two\r\nlines');
    });
});
