import type { QueryInterface, Sequelize } from 'sequelize';

export interface Migration {
  name: string;
  up(qi: QueryInterface, sequelize: Sequelize): Promise<void>;
  down(qi: QueryInterface, sequelize: Sequelize): Promise<void>;
}
