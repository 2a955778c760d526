import { afterAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { QueryTypes } from 'sequelize';
import { inject } from 'vitest';
import { connectDb, migrate, migrator } from '../../server/db/index';

const adminUrl = inject('pgAdminUrl');
const name = `empty_${Date.now()}`;

afterAll(async () => {
  const c = new pg.Client({ connectionString: adminUrl });
  await c.connect();
  await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  await c.end();
});

describe('migrations', () => {
  it('build the whole schema from an empty database, undo it, and build it again', async () => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`CREATE DATABASE ${name}`);
    await c.end();
    const db = await connectDb(adminUrl.replace(/\/postgres$/, `/${name}`));
    const tables = async () =>
      (await db.sequelize.query<{ tablename: string }>(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`, { type: QueryTypes.SELECT })).map((r) => r.tablename);
    await migrate(db.sequelize);
    const built = await tables();
    expect(built).toEqual(expect.arrayContaining(['alerts', 'audit_log', 'episodes', 'faults', 'gateway_status_events', 'gateways', 'messages', 'messages_default', 'quarantine', 'schema_migrations', 'switch_tokens', 'unit_dm1_state', 'units', 'users']));
    await migrator(db.sequelize).down({ to: 0 });
    expect(await tables()).toEqual(['schema_migrations']);
    await migrate(db.sequelize);
    expect(await tables()).toEqual(built);
    await db.close();
  });
});
