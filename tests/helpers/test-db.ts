// A database of this test file's own, cloned from the migrated template.
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { inject } from 'vitest';

export async function createTestDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const adminUrl = inject('pgAdminUrl');
  const template = inject('pgTemplate');
  const name = `t_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  // CREATE DATABASE ... TEMPLATE needs the template to have no other sessions; retry briefly if another file is cloning.
  for (let attempt = 0; ; attempt++) {
    try {
      await admin.query(`CREATE DATABASE ${name} TEMPLATE ${template}`);
      break;
    } catch (err) {
      if (attempt > 50) throw err;
      await new Promise((r) => setTimeout(r, 100 + Math.random() * 200));
    }
  }
  await admin.end();
  return {
    url: adminUrl.replace(/\/postgres$/, `/${name}`),
    async drop() {
      const c = new pg.Client({ connectionString: adminUrl });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await c.end();
    },
  };
}
