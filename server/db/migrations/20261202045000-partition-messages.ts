import type { Migration } from './types';

// The raw history grows without end: partition it by event time (PostgreSQL declarative partitioning,
// one partition a month, created ahead by server/db/partitions.ts) so that old months can be dropped
// whole under a retention setting. The primary key has to include the partition key, so it becomes
// (gateway, boot, seq, ts): a redelivered copy has the same ts and still conflicts. Anything outside
// the created months lands in the default partition.
export const migration: Migration = {
  name: '20261202045000-partition-messages',
  async up(_qi, sequelize) {
    await sequelize.query(`ALTER TABLE messages RENAME TO messages_unpartitioned`);
    await sequelize.query(`ALTER INDEX messages_unit_position RENAME TO messages_unpartitioned_unit_position`);
    await sequelize.query(`ALTER INDEX messages_unit_ts RENAME TO messages_unpartitioned_unit_ts`);
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
        PRIMARY KEY (gateway_id, boot, seq, ts)
      ) PARTITION BY RANGE (ts)`);
    await sequelize.query(`CREATE TABLE messages_default PARTITION OF messages DEFAULT`);
    await sequelize.query(`CREATE INDEX messages_unit_position ON messages (unit_id, stream, boot, seq)`);
    await sequelize.query(`CREATE INDEX messages_unit_ts ON messages (unit_id, ts)`);
    await sequelize.query(`INSERT INTO messages SELECT * FROM messages_unpartitioned`);
    await sequelize.query(`DROP TABLE messages_unpartitioned`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`CREATE TABLE messages_flat (LIKE messages INCLUDING DEFAULTS)`);
    await sequelize.query(`INSERT INTO messages_flat SELECT * FROM messages`);
    await sequelize.query(`DROP TABLE messages`);
    await sequelize.query(`ALTER TABLE messages_flat RENAME TO messages`);
    await sequelize.query(`ALTER TABLE messages ADD PRIMARY KEY (gateway_id, boot, seq)`);
    await sequelize.query(`ALTER TABLE messages ADD FOREIGN KEY (unit_id) REFERENCES units(id)`);
    await sequelize.query(`CREATE INDEX messages_unit_position ON messages (unit_id, stream, boot, seq)`);
    await sequelize.query(`CREATE INDEX messages_unit_ts ON messages (unit_id, ts)`);
  },
};
