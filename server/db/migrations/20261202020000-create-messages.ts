import type { Migration } from './types';

// The raw history: every accepted gateway message, de-duplicated on (gateway, boot, seq) by the primary key.
export const migration: Migration = {
  name: '20261202020000-create-messages',
  async up(_qi, sequelize) {
    await sequelize.query(`
      CREATE TABLE messages (
        gateway_id varchar(64) NOT NULL,
        boot bigint NOT NULL,
        seq bigint NOT NULL,
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        stream integer NOT NULL,
        kind varchar(16) NOT NULL CHECK (kind IN ('telemetry', 'can', 'power')),
        ts timestamptz NOT NULL,
        payload jsonb NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (gateway_id, boot, seq)
      )`);
    await sequelize.query(`CREATE INDEX messages_unit_position ON messages (unit_id, stream, boot, seq)`);
    await sequelize.query(`CREATE INDEX messages_unit_ts ON messages (unit_id, ts)`);
    await sequelize.query(`
      CREATE TABLE quarantine (
        id bigserial PRIMARY KEY,
        gateway_id varchar(200),
        topic varchar(300) NOT NULL,
        reason text NOT NULL,
        excerpt text NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now()
      )`);
    await sequelize.query(`CREATE INDEX quarantine_received ON quarantine (received_at)`);
  },
  async down(_qi, sequelize) {
    await sequelize.query('DROP TABLE IF EXISTS quarantine; DROP TABLE IF EXISTS messages');
  },
};
