import {
  DataTypes,
  Model,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { Bank } from './bank';
import { Visit } from './visit';

/** A bank a visit covers. */
export class VisitBank extends Model<InferAttributes<VisitBank>, InferCreationAttributes<VisitBank>> {
  declare visitId: ForeignKey<Visit['id']>;
  declare bankId: ForeignKey<Bank['id']>;
}

VisitBank.init(
  {
    visitId: { type: DataTypes.UUID, primaryKey: true },
    bankId: { type: DataTypes.UUID, primaryKey: true },
  },
  { sequelize, tableName: 'visit_banks', timestamps: false },
);

Visit.belongsToMany(Bank, { through: VisitBank, foreignKey: 'visitId', otherKey: 'bankId', as: 'banks' });
Bank.belongsToMany(Visit, { through: VisitBank, foreignKey: 'bankId', otherKey: 'visitId', as: 'visits' });
