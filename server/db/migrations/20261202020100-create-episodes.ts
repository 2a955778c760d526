import type { Migration } from './types';

// Key-off purge episodes. One row per key-off, identified by its position; re-judging updates it in place.
export const migration: Migration = {
  name: '20261202020100-create-episodes',
  async up(_qi, sequelize) {
    await sequelize.query(`
      CREATE TABLE episodes (
        id bigserial PRIMARY KEY,
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        stream integer NOT NULL,
        boot bigint NOT NULL,
        seq bigint NOT NULL,
        key_off_at timestamptz NOT NULL,
        purge_seconds integer NOT NULL,
        loss_threshold_v double precision NOT NULL,
        outcome varchar(16) NOT NULL,
        settled_by varchar(16),
        ended_at timestamptz,
        seconds_into_purge double precision,
        ambient_c double precision,
        min_ambient_after_c double precision,
        freeze_exposure varchar(16),
        next_key_on_at timestamptz,
        evidence jsonb,
        final boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (unit_id, stream, boot, seq)
      )`);
    await sequelize.query(`CREATE INDEX episodes_key_off ON episodes (key_off_at DESC)`);
    await sequelize.query(`CREATE INDEX episodes_unit_key_off ON episodes (unit_id, key_off_at DESC)`);
    await sequelize.query(`CREATE INDEX episodes_outcome_key_off ON episodes (outcome, key_off_at DESC)`);
    await sequelize.query(`
      CREATE TABLE faults (
        id bigserial PRIMARY KEY,
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        at timestamptz NOT NULL,
        source_address smallint NOT NULL,
        spn integer NOT NULL,
        fmi smallint NOT NULL,
        conversion_method smallint NOT NULL DEFAULT 0,
        occurrence_count smallint,
        lamps jsonb NOT NULL,
        episode_id bigint REFERENCES episodes(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (unit_id, at, source_address, spn, fmi)
      )`);
    await sequelize.query(`CREATE INDEX faults_at ON faults (at DESC)`);
    await sequelize.query(`CREATE INDEX faults_unit_at ON faults (unit_id, at DESC)`);
    await sequelize.query(`CREATE INDEX faults_episode ON faults (episode_id)`);
    // The DM1 tracker's state per unit (previous DM1 of each source address, open BAM sessions),
    // written with the faults it produced, so a restart resumes exactly where the last commit left off.
    await sequelize.query(`
      CREATE TABLE unit_dm1_state (
        unit_id varchar(64) PRIMARY KEY REFERENCES units(id),
        snapshot jsonb NOT NULL,
        last_stream integer NOT NULL,
        last_boot bigint NOT NULL,
        last_seq bigint NOT NULL
      )`);
  },
  async down(_qi, sequelize) {
    await sequelize.query('DROP TABLE IF EXISTS unit_dm1_state; DROP TABLE IF EXISTS faults; DROP TABLE IF EXISTS episodes');
  },
};
