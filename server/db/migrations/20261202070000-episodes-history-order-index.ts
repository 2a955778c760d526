import type { Migration } from './types';

// The history page's order (key-off time, then id, in either direction) as one index that also
// carries the unit, so "the newest episodes of this depot's units" is found in the index alone and
// only the page's own rows are read from the table. It replaces the key-off index it starts with.
export const migration: Migration = {
  name: '20261202070000-episodes-history-order-index',
  async up(_qi, sequelize) {
    await sequelize.query(`CREATE INDEX episodes_key_off_id ON episodes (key_off_at DESC, id DESC) INCLUDE (unit_id)`);
    await sequelize.query(`DROP INDEX IF EXISTS episodes_key_off`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`CREATE INDEX IF NOT EXISTS episodes_key_off ON episodes (key_off_at DESC)`);
    await sequelize.query(`DROP INDEX IF EXISTS episodes_key_off_id`);
  },
};
