import { DataTypes, Model, type Sequelize } from 'sequelize';

export class AuditEntry extends Model {
  declare id: number;
  declare at: Date;
  declare actorId: number | null;
  declare action: string;
  declare target: string;
  declare details: Record<string, unknown> | null;

  static initModel(sequelize: Sequelize) {
    AuditEntry.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        at: { type: DataTypes.DATE, allowNull: false },
        actorId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(64), allowNull: false },
        target: { type: DataTypes.STRING(200), allowNull: false },
        details: { type: DataTypes.JSONB, allowNull: true },
      },
      { sequelize, tableName: 'audit_log', underscored: true, timestamps: false },
    );
  }
}
