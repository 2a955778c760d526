import { DataTypes } from 'sequelize';
import type { Migration } from './types';

export const migration: Migration = {
  name: '20261202010200-create-gateways',
  async up(qi) {
    await qi.createTable('gateways', {
      gateway_id: { type: DataTypes.STRING(64), primaryKey: true },
      unit_id: { type: DataTypes.STRING(64), allowNull: false, references: { model: 'units', key: 'id' }, onDelete: 'RESTRICT' },
      // SHA-256 of a 256-bit random token: high entropy, so a fast hash is enough.
      secret_hash: { type: DataTypes.STRING(64), allowNull: false },
      // 0 for a unit's first gateway, then 1, 2 ... A replacement starts its own boot counter.
      stream: { type: DataTypes.INTEGER, allowNull: false },
      revoked_at: { type: DataTypes.DATE, allowNull: true },
      last_seen_at: { type: DataTypes.DATE, allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false },
      updated_at: { type: DataTypes.DATE, allowNull: false },
    });
    await qi.addIndex('gateways', ['unit_id', 'stream'], { unique: true });
  },
  async down(qi) {
    await qi.dropTable('gateways', {});
  },
};
