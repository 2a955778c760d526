import type { Migration } from './types';

// Drivers and who drove which unit when. An episode's driver is the assignment covering its
// key-off, found at query time (episodes are never rewritten). Plus the indexes the history
// filters and the battery reader need.
export const migration: Migration = {
  name: '20261202050000-create-drivers',
  async up(_qi, sequelize) {
    await sequelize.query(`
      CREATE TABLE drivers (
        id serial PRIMARY KEY,
        code varchar(32) NOT NULL UNIQUE,
        name varchar(200) NOT NULL,
        depot varchar(100),
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await sequelize.query(`
      CREATE TABLE driver_assignments (
        id bigserial PRIMARY KEY,
        driver_id integer NOT NULL REFERENCES drivers(id),
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        from_at timestamptz NOT NULL,
        to_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        CHECK (to_at IS NULL OR to_at > from_at)
      )`);
    // The lateral join "assignment of this unit covering this instant" walks this index backwards.
    await sequelize.query(`CREATE INDEX driver_assignments_unit_from ON driver_assignments (unit_id, from_at DESC)`);
    await sequelize.query(`CREATE INDEX driver_assignments_driver_from ON driver_assignments (driver_id, from_at DESC)`);
    // History sorts on these columns within a time range.
    await sequelize.query(`CREATE INDEX episodes_freeze_key_off ON episodes (freeze_exposure, key_off_at DESC)`);
    await sequelize.query(`CREATE INDEX faults_spn_at ON faults (spn, at DESC)`);
    // The battery reader scans one unit's telemetry by time.
    await sequelize.query(`CREATE INDEX messages_unit_kind_ts ON messages (unit_id, kind, ts)`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`DROP INDEX IF EXISTS messages_unit_kind_ts; DROP INDEX IF EXISTS faults_spn_at;
      DROP INDEX IF EXISTS episodes_freeze_key_off; DROP TABLE IF EXISTS driver_assignments; DROP TABLE IF EXISTS drivers`);
  },
};
