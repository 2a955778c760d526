import type { Sequelize } from 'sequelize';
import { User } from './user';
import { Unit } from './unit';
import { Gateway } from './gateway';
import { AuditEntry } from './audit-entry';

export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Unit.initModel(sequelize);
  Gateway.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  Unit.hasMany(Gateway, { foreignKey: 'unitId', as: 'gateways' });
  Gateway.belongsTo(Unit, { foreignKey: 'unitId', as: 'unit' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
}
