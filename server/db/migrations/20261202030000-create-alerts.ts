import type { Migration } from './types';

export const migration: Migration = {
  name: '20261202030000-create-alerts',
  async up(_qi, sequelize) {
    await sequelize.query(`
      CREATE TABLE alerts (
        id bigserial PRIMARY KEY,
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        episode_id bigint REFERENCES episodes(id) ON DELETE SET NULL,
        kind varchar(32) NOT NULL CHECK (kind IN ('interruptedPurge', 'undeterminedCold', 'contactLost')),
        status varchar(16) NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'acknowledged', 'resolved')),
        raised_at timestamptz NOT NULL DEFAULT now(),
        escalated_at timestamptz,
        acknowledged_at timestamptz,
        acknowledged_by integer REFERENCES users(id),
        resolved_at timestamptz,
        resolved_by integer REFERENCES users(id),
        comment text,
        UNIQUE (episode_id, kind)
      )`);
    await sequelize.query(`CREATE INDEX alerts_status_raised ON alerts (status, raised_at DESC)`);
    await sequelize.query(`
      CREATE TABLE switch_tokens (
        unit_id varchar(64) PRIMARY KEY REFERENCES units(id),
        -- A read-only capability for one unit's hold/clear; kept as is so that sheets can be reprinted.
        token varchar(64) NOT NULL UNIQUE,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    // The connection view: status messages (online, and the broker's will "offline"). Never evidence.
    await sequelize.query(`
      CREATE TABLE gateway_status_events (
        id bigserial PRIMARY KEY,
        gateway_id varchar(64) NOT NULL,
        unit_id varchar(64) REFERENCES units(id),
        state varchar(16) NOT NULL,
        boot bigint,
        at timestamptz NOT NULL DEFAULT now()
      )`);
    await sequelize.query(`CREATE INDEX gateway_status_unit_at ON gateway_status_events (unit_id, at)`);
  },
  async down(_qi, sequelize) {
    await sequelize.query('DROP TABLE IF EXISTS gateway_status_events; DROP TABLE IF EXISTS switch_tokens; DROP TABLE IF EXISTS alerts');
  },
};
