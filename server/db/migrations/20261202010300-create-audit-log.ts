import { DataTypes } from 'sequelize';
import type { Migration } from './types';

export const migration: Migration = {
  name: '20261202010300-create-audit-log',
  async up(qi) {
    await qi.createTable('audit_log', {
      id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
      at: { type: DataTypes.DATE, allowNull: false },
      actor_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' } },
      action: { type: DataTypes.STRING(64), allowNull: false },
      target: { type: DataTypes.STRING(200), allowNull: false },
      details: { type: DataTypes.JSONB, allowNull: true },
    });
    await qi.addIndex('audit_log', ['at']);
  },
  async down(qi) {
    await qi.dropTable('audit_log', {});
  },
};
