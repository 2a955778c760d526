// A fleet for the benchmark, written straight into the service's tables (10,000 gateways through the API
// would measure the API, not the ingest). The secrets are hashed as the service hashes them.
import pg from 'pg';
import { brokerPasswordHash, hashGatewaySecret, newGatewaySecret } from '../../server/modules/gateways/secrets';

export interface BenchGateway {
  id: string;
  secret: string;
  unitId: string;
}

export async function provisionFleet(databaseUrl: string, n: number, depots = 20): Promise<BenchGateway[]> {
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  const gws: BenchGateway[] = Array.from({ length: n }, (_, i) => ({ id: `bench-gw-${i}`, secret: newGatewaySecret(), unitId: `BU-${i}` }));
  const salt = Buffer.alloc(12, 7); // one salt for all: speed over secrecy in a throwaway benchmark database
  for (let i = 0; i < gws.length; i += 2000) {
    const part = gws.slice(i, i + 2000);
    await c.query(
      `INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at)
       SELECT u, 'Bench unit ' || u, 'Depot ' || (ord % $2), CASE WHEN ord % 3 = 0 THEN 24 ELSE 12 END, 120,
              CASE WHEN ord % 3 = 0 THEN 12.0 ELSE 6.0 END, now(), now()
       FROM unnest($1::text[]) WITH ORDINALITY AS x(u, ord)`,
      [part.map((g) => g.unitId), depots],
    );
    await c.query(
      `INSERT INTO gateways (gateway_id, unit_id, secret_hash, broker_hash, stream, created_at, updated_at)
       SELECT * , 0, now(), now() FROM unnest($1::text[], $2::text[], $3::text[], $4::text[])`,
      [part.map((g) => g.id), part.map((g) => g.unitId), part.map((g) => hashGatewaySecret(g.secret)), part.map((g) => brokerPasswordHash(g.secret, salt, 1))],
    );
  }
  await c.end();
  return gws;
}

export async function createDatabase(adminUrl: string, name: string): Promise<string> {
  const c = new pg.Client({ connectionString: adminUrl });
  await c.connect();
  await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  await c.query(`CREATE DATABASE ${name}`);
  await c.end();
  return adminUrl.replace(/\/[^/]+$/, `/${name}`);
}
