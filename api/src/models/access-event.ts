import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { User } from './user';

/** One entry of the sign-in log: a sign-in, a sign-out, a failed attempt or an access change. */
export class AccessEvent extends Model<
  InferAttributes<AccessEvent>,
  InferCreationAttributes<AccessEvent>
> {
  declare id: CreationOptional<string>;
  declare kind: string;
  declare userId: ForeignKey<User['id']> | null;
  declare actorId: ForeignKey<User['id']> | null;
  declare login: string | null;
  declare ip: string | null;
  declare userAgent: string | null;
  declare detail: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
}

AccessEvent.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    kind: { type: DataTypes.TEXT, allowNull: false },
    login: { type: DataTypes.TEXT },
    ip: { type: DataTypes.TEXT },
    userAgent: { type: DataTypes.TEXT },
    detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'access_events', updatedAt: false },
);

AccessEvent.belongsTo(User, { foreignKey: 'userId', as: 'user' });
AccessEvent.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
