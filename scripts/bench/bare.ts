// The bare pipeline the product is measured against: the same broker (aedes), no checks, no judgement;
// the publish hook parses the JSON and COPYs the rows, acknowledging after the commit, in groups.
import { Aedes } from 'aedes';
import { createServer } from 'node:net';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';

const [, , databaseUrl, portArg] = process.argv;
const pool = new pg.Pool({ connectionString: databaseUrl, max: 4 });

interface Row { line: string; done(err?: Error | null): void }
let batch: Row[] = [];
let timer: NodeJS.Timeout | null = null;
let writing = false;

async function flush() {
  timer = null;
  if (writing || batch.length === 0) return;
  writing = true;
  const rows = batch.splice(0, 5000);
  const client = await pool.connect();
  try {
    await client.query('BEGIN');
    await pipeline(Readable.from(rows.map((r) => r.line)), client.query(copyFrom('COPY bare_messages (gateway_id, boot, seq, ts, payload) FROM STDIN')));
    await client.query('COMMIT');
    for (const r of rows) r.done(null);
  } catch (err) {
    await client.query('ROLLBACK').catch(() => {});
    for (const r of rows) r.done(err as Error);
  } finally {
    client.release();
    writing = false;
    if (batch.length) void flush();
  }
}

const esc = (s: string) => s.replace(/\\/g, '\\\\').replace(/\t/g, '\\t').replace(/\n/g, '\\n');

async function main() {
  await pool.query('CREATE TABLE IF NOT EXISTS bare_messages (gateway_id text, boot bigint, seq bigint, ts timestamptz, payload jsonb)');
  const broker = await Aedes.createBroker({
    authorizePublish: ((client: { id: string } | null, packet: { topic: string; payload: Buffer }, cb: (e?: Error | null) => void) => {
      if (!client) return cb(null);
      let m: { boot: number; seq: number; ts: string };
      try {
        m = JSON.parse(packet.payload.toString('utf8'));
      } catch {
        return cb(null);
      }
      const gatewayId = packet.topic.split('/')[3] ?? client.id;
      batch.push({ line: `${esc(gatewayId)}\t${m.boot}\t${m.seq}\t${m.ts}\t${esc(packet.payload.toString('utf8'))}\n`, done: cb });
      if (batch.length >= 2000) void flush();
      else if (!timer) timer = setTimeout(() => void flush(), 15);
    }) as never,
    concurrency: 1000,
  });
  const server = createServer((socket) => {
    socket.setNoDelay(true);
    broker.handle(socket);
  });
  server.listen(Number(portArg), '127.0.0.1', () => process.stdout.write('ready\n'));
}

main().catch((err) => {
  process.stderr.write(`bare: ${err.stack ?? err}\n`);
  process.exit(1);
});
