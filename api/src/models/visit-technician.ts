import {
  DataTypes,
  Model,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { User } from './user';
import { Visit } from './visit';

/** A technician assigned to a visit. */
export class VisitTechnician extends Model<
  InferAttributes<VisitTechnician>,
  InferCreationAttributes<VisitTechnician>
> {
  declare visitId: ForeignKey<Visit['id']>;
  declare userId: ForeignKey<User['id']>;
}

VisitTechnician.init(
  {
    visitId: { type: DataTypes.UUID, primaryKey: true },
    userId: { type: DataTypes.UUID, primaryKey: true },
  },
  { sequelize, tableName: 'visit_technicians', timestamps: false },
);

Visit.belongsToMany(User, { through: VisitTechnician, foreignKey: 'visitId', otherKey: 'userId', as: 'technicians' });
User.belongsToMany(Visit, { through: VisitTechnician, foreignKey: 'userId', otherKey: 'visitId', as: 'visits' });
