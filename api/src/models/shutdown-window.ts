import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { Area } from './area';

/**
 * A shutdown window of an area: when its drives are de-energised. `startsAt` / `endsAt` are the
 * first occurrence; `recurrence` an RRULE body (no DTSTART), null for a one-off.
 */
export class ShutdownWindow extends Model<InferAttributes<ShutdownWindow>, InferCreationAttributes<ShutdownWindow>> {
  declare id: CreationOptional<string>;
  declare areaId: ForeignKey<Area['id']>;
  declare title: string;
  declare startsAt: Date;
  declare endsAt: Date;
  declare recurrence: string | null;
  declare notes: CreationOptional<string>;
  declare version: CreationOptional<number>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare area?: NonAttribute<Area>;
}

ShutdownWindow.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    title: { type: DataTypes.TEXT, allowNull: false },
    startsAt: { type: DataTypes.DATE, allowNull: false },
    endsAt: { type: DataTypes.DATE, allowNull: false },
    recurrence: { type: DataTypes.TEXT },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    retiredAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'shutdown_windows' },
);

Area.hasMany(ShutdownWindow, { foreignKey: 'areaId', as: 'shutdownWindows' });
ShutdownWindow.belongsTo(Area, { foreignKey: 'areaId', as: 'area' });
