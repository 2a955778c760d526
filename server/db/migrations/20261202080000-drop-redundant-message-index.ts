import type { Migration } from './types';

// Every query that reads a unit's messages by time also names the kind (readings, battery), which
// (unit_id, kind, ts) serves; the older (unit_id, ts) index only cost the ingest a fourth index update
// per stored message.
export const migration: Migration = {
  name: '20261202080000-drop-redundant-message-index',
  async up(_qi, sequelize) {
    await sequelize.query(`DROP INDEX IF EXISTS messages_unit_ts`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`CREATE INDEX IF NOT EXISTS messages_unit_ts ON messages (unit_id, ts)`);
  },
};
