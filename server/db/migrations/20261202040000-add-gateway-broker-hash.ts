import type { Migration } from './types';

// An external broker (Mosquitto) checks passwords itself: keep each secret also in its password-file form
// (PBKDF2-SHA512, mosquitto_passwd's "$7$" format), so the files can be written from this table.
export const migration: Migration = {
  name: '20261202040000-add-gateway-broker-hash',
  async up(_qi, sequelize) {
    await sequelize.query(`ALTER TABLE gateways ADD COLUMN broker_hash text`);
    await sequelize.query(`ALTER TABLE units ADD COLUMN judged_version bigint NOT NULL DEFAULT 0`);
  },
  async down(_qi, sequelize) {
    await sequelize.query(`ALTER TABLE gateways DROP COLUMN broker_hash; ALTER TABLE units DROP COLUMN judged_version`);
  },
};
