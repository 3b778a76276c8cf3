import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db/sequelize';

/** A person who signs in to Ebbline, with the roles Ebbline grants them. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare subject: string | null;
  declare email: string;
  declare name: string;
  declare roles: CreationOptional<string[]>;
  declare active: CreationOptional<boolean>;
  declare lastSignInAt: Date | null;
  /** Hours a week the person is available for visits (0–80). */
  declare availableHoursPerWeek: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

User.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    subject: { type: DataTypes.TEXT, unique: true },
    email: { type: DataTypes.TEXT, allowNull: false, unique: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    roles: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    lastSignInAt: { type: DataTypes.DATE },
    availableHoursPerWeek: {
      type: DataTypes.DECIMAL(5, 1),
      allowNull: false,
      defaultValue: 37.5,
      // PostgreSQL's numeric arrives as text: hours are a plain number everywhere else
      get() {
        return Number(this.getDataValue('availableHoursPerWeek'));
      },
    },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'users' },
);
