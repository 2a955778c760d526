import { Sequelize } from 'sequelize';
import { Umzug, SequelizeStorage } from 'umzug';
import { migrations } from './migrations/index';
import { initModels } from './models/init';
import { logger } from '../lib/logger';

const log = logger('db');

export interface Db {
  sequelize: Sequelize;
  close(): Promise<void>;
}

export async function connectDb(url: string, opts: { poolMax?: number } = {}): Promise<Db> {
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: false,
    pool: { max: opts.poolMax ?? 10, min: 0, idle: 10_000, acquire: 30_000 },
    define: { underscored: true },
  });
  await sequelize.authenticate();
  initModels(sequelize);
  return { sequelize, close: () => sequelize.close() };
}

export function migrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: () => m.up(sequelize.getQueryInterface(), sequelize),
      down: () => m.down(sequelize.getQueryInterface(), sequelize),
    })),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize) {
  const done = await migrator(sequelize).up();
  if (done.length) log.info({ migrations: done.map((m) => m.name) }, 'migrations applied');
}
