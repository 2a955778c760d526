import { DataTypes, Model, type Sequelize } from 'sequelize';

export class Unit extends Model {
  declare id: string;
  declare name: string;
  declare depot: string;
  declare systemVoltage: 12 | 24;
  declare purgeSeconds: number;
  declare lossThresholdV: number;
  declare linkSpns: number[] | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Unit.init(
      {
        id: { type: DataTypes.STRING(64), primaryKey: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        depot: { type: DataTypes.STRING(120), allowNull: false },
        systemVoltage: { type: DataTypes.SMALLINT, allowNull: false },
        purgeSeconds: { type: DataTypes.INTEGER, allowNull: false },
        lossThresholdV: { type: DataTypes.DOUBLE, allowNull: false },
        linkSpns: { type: DataTypes.ARRAY(DataTypes.INTEGER), allowNull: true },
      },
      { sequelize, tableName: 'units', underscored: true },
    );
  }
}
