import { DataTypes, Model, type Sequelize } from 'sequelize';

export class Gateway extends Model {
  declare gatewayId: string;
  declare unitId: string;
  declare secretHash: string;
  declare brokerHash: string | null;
  declare stream: number;
  declare revokedAt: Date | null;
  declare lastSeenAt: Date | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    Gateway.init(
      {
        gatewayId: { type: DataTypes.STRING(64), primaryKey: true },
        unitId: { type: DataTypes.STRING(64), allowNull: false },
        secretHash: { type: DataTypes.STRING(64), allowNull: false },
        brokerHash: { type: DataTypes.TEXT, allowNull: true },
        stream: { type: DataTypes.INTEGER, allowNull: false },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        lastSeenAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'gateways', underscored: true },
    );
  }
}
