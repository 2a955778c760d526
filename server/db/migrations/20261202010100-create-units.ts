import { DataTypes } from 'sequelize';
import type { Migration } from './types';

export const migration: Migration = {
  name: '20261202010100-create-units',
  async up(qi, sequelize) {
    await qi.createTable('units', {
      id: { type: DataTypes.STRING(64), primaryKey: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      depot: { type: DataTypes.STRING(120), allowNull: false },
      system_voltage: { type: DataTypes.SMALLINT, allowNull: false },
      purge_seconds: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 120 },
      loss_threshold_v: { type: DataTypes.DOUBLE, allowNull: false },
      link_spns: { type: DataTypes.ARRAY(DataTypes.INTEGER), allowNull: true },
      created_at: { type: DataTypes.DATE, allowNull: false },
      updated_at: { type: DataTypes.DATE, allowNull: false },
    });
    await sequelize.query(`ALTER TABLE units ADD CONSTRAINT units_system_voltage CHECK (system_voltage IN (12, 24))`);
    await sequelize.query(`ALTER TABLE units ADD CONSTRAINT units_purge_seconds CHECK (purge_seconds BETWEEN 10 AND 3600)`);
    await qi.addIndex('units', ['depot']);
  },
  async down(qi) {
    await qi.dropTable('units', {});
  },
};
