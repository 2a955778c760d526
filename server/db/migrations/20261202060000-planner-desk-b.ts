import type { Migration } from './types';

// Work orders with their checks and photos, depots with coordinates and forecast lows, e-mail
// subscriptions and the development mailbox; one more alert kind (a forecast freeze ahead).
export const migration: Migration = {
  name: '20261202060000-planner-desk-b',
  async up(_qi, sequelize) {
    await sequelize.query(`
      CREATE TABLE work_orders (
        id bigserial PRIMARY KEY,
        unit_id varchar(64) NOT NULL REFERENCES units(id),
        source_kind varchar(16) NOT NULL CHECK (source_kind IN ('alert', 'episode', 'fault')),
        alert_id bigint REFERENCES alerts(id) ON DELETE SET NULL,
        episode_id bigint REFERENCES episodes(id) ON DELETE SET NULL,
        fault_id bigint REFERENCES faults(id) ON DELETE SET NULL,
        title varchar(200) NOT NULL,
        status varchar(16) NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'inProgress', 'closed')),
        assignee_id integer REFERENCES users(id),
        outcome varchar(24) CHECK (outcome IN ('repaired', 'noFaultFound', 'partsOrdered', 'referred', 'cancelled')),
        outcome_note text,
        created_by integer REFERENCES users(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        closed_at timestamptz,
        closed_by integer REFERENCES users(id),
        CHECK ((status = 'closed') = (outcome IS NOT NULL))
      )`);
    await sequelize.query(`CREATE INDEX work_orders_status ON work_orders (status, created_at DESC)`);
    await sequelize.query(`CREATE INDEX work_orders_assignee ON work_orders (assignee_id, status)`);
    await sequelize.query(`CREATE INDEX work_orders_unit ON work_orders (unit_id, created_at DESC)`);
    await sequelize.query(`
      CREATE TABLE work_order_checks (
        work_order_id bigint NOT NULL REFERENCES work_orders(id) ON DELETE CASCADE,
        check_key varchar(24) NOT NULL CHECK (check_key IN ('coilResistance', 'defFreezeDamage', 'isolator', 'indicator')),
        ohms double precision,
        system_voltage smallint,
        verdict varchar(8) NOT NULL CHECK (verdict IN ('pass', 'fail', 'low', 'high')),
        note text,
        recorded_by integer REFERENCES users(id),
        recorded_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (work_order_id, check_key)
      )`);
    await sequelize.query(`
      CREATE TABLE work_order_photos (
        id bigserial PRIMARY KEY,
        work_order_id bigint NOT NULL REFERENCES work_orders(id) ON DELETE CASCADE,
        stored_name varchar(80) NOT NULL UNIQUE,
        original_name varchar(255) NOT NULL,
        mime varchar(32) NOT NULL,
        size_bytes integer NOT NULL,
        uploaded_by integer REFERENCES users(id),
        uploaded_at timestamptz NOT NULL DEFAULT now()
      )`);
    await sequelize.query(`
      CREATE TABLE depots (
        name varchar(120) PRIMARY KEY,
        latitude double precision NOT NULL CHECK (latitude BETWEEN -90 AND 90),
        longitude double precision NOT NULL CHECK (longitude BETWEEN -180 AND 180),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await sequelize.query(`
      CREATE TABLE depot_forecasts (
        depot varchar(120) PRIMARY KEY,
        fetched_at timestamptz NOT NULL,
        low_c double precision NOT NULL,
        low_at timestamptz NOT NULL,
        hours jsonb NOT NULL
      )`);
    await sequelize.query(`
      CREATE TABLE forecast_alerts (
        alert_id bigint PRIMARY KEY REFERENCES alerts(id) ON DELETE CASCADE,
        depot varchar(120) NOT NULL,
        low_c double precision NOT NULL,
        low_at timestamptz NOT NULL,
        -- the first forecast hour at or under the DEF freezing point: the time to act by
        act_by timestamptz NOT NULL
      )`);
    await sequelize.query(`ALTER TABLE alerts DROP CONSTRAINT IF EXISTS alerts_kind_check`);
    await sequelize.query(`ALTER TABLE alerts ADD CONSTRAINT alerts_kind_check CHECK (kind IN ('interruptedPurge', 'undeterminedCold', 'contactLost', 'forecastFreeze'))`);
    await sequelize.query(`
      CREATE TABLE depot_subscriptions (
        user_id integer NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        depot varchar(120) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (user_id, depot)
      )`);
    // One mail per alert and reason, however often the alert is published.
    await sequelize.query(`
      CREATE TABLE alert_mails (
        alert_id bigint NOT NULL REFERENCES alerts(id) ON DELETE CASCADE,
        reason varchar(16) NOT NULL CHECK (reason IN ('raised', 'escalated')),
        recipients text[] NOT NULL,
        sent_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (alert_id, reason)
      )`);
    await sequelize.query(`
      CREATE TABLE digest_runs (
        id bigserial PRIMARY KEY,
        slot varchar(32) UNIQUE,
        recipients text[] NOT NULL,
        sent_at timestamptz NOT NULL DEFAULT now()
      )`);
    // What the development SMTP fake received (never used with a real SMTP_URL).
    await sequelize.query(`
      CREATE TABLE dev_mailbox (
        id bigserial PRIMARY KEY,
        received_at timestamptz NOT NULL DEFAULT now(),
        mail_from text,
        rcpt_to text[] NOT NULL,
        subject text NOT NULL,
        text_body text NOT NULL,
        raw text NOT NULL
      )`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`DROP TABLE IF EXISTS dev_mailbox, digest_runs, alert_mails, depot_subscriptions, forecast_alerts, depot_forecasts, depots, work_order_photos, work_order_checks, work_orders`);
    await sequelize.query(`DELETE FROM alerts WHERE kind = 'forecastFreeze'`);
    await sequelize.query(`ALTER TABLE alerts DROP CONSTRAINT IF EXISTS alerts_kind_check`);
    await sequelize.query(`ALTER TABLE alerts ADD CONSTRAINT alerts_kind_check CHECK (kind IN ('interruptedPurge', 'undeterminedCold', 'contactLost'))`);
  },
};
