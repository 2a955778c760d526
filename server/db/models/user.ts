import { DataTypes, Model, type Sequelize } from 'sequelize';

export const ROLES = ['admin', 'monitor', 'planner', 'technician'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model {
  declare id: number;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare active: boolean;
  declare lastLoginAt: Date | null;
  declare createdAt: Date;
  declare updatedAt: Date;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        lastLoginAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'users', underscored: true },
    );
  }
}
