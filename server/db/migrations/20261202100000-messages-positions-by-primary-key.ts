import type { Migration } from './types';

// A unit's messages in position order are read through the primary key (gateway, boot, seq, ts), gateway
// by gateway (the gateways table maps a unit's stream to its gateway, uniquely): the (unit, stream, boot,
// seq) index only repeated that order and cost every stored message one more index entry (measured at
// about a quarter of the raw insert's time in PostgreSQL).
export const migration: Migration = {
  name: '20261202100000-messages-positions-by-primary-key',
  async up(_qi, sequelize) {
    await sequelize.query(`DROP INDEX IF EXISTS messages_unit_position`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`CREATE INDEX IF NOT EXISTS messages_unit_position ON messages (unit_id, stream, boot, seq)`);
  },
};
