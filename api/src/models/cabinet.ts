import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { CabinetStatus, Criticality } from '../../../shared/constants/register';
import { sequelize } from '../db/sequelize';
import { Area } from './area';

/** A drive cabinet, known on the floor by its tag. */
export class Cabinet extends Model<InferAttributes<Cabinet>, InferCreationAttributes<Cabinet>> {
  declare id: CreationOptional<string>;
  declare areaId: ForeignKey<Area['id']>;
  declare tag: string;
  declare location: CreationOptional<string>;
  declare driveMake: CreationOptional<string>;
  declare driveModel: CreationOptional<string>;
  declare supplyVolts: number;
  declare dcBusVolts: number | null;
  declare ratedPowerKilowatts: number | null;
  declare markedWaitMinutes: number | null;
  declare criticality: CreationOptional<Criticality>;
  declare environmentNotes: CreationOptional<string>;
  declare commissionedOn: string | null;
  declare status: CreationOptional<CabinetStatus>;
  declare version: CreationOptional<number>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare area?: NonAttribute<Area>;
}

Cabinet.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    tag: { type: DataTypes.TEXT, allowNull: false },
    location: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    driveMake: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    driveModel: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    supplyVolts: { type: DataTypes.DOUBLE, allowNull: false },
    dcBusVolts: { type: DataTypes.DOUBLE },
    ratedPowerKilowatts: { type: DataTypes.DOUBLE },
    markedWaitMinutes: { type: DataTypes.INTEGER },
    criticality: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'medium' },
    environmentNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    commissionedOn: { type: DataTypes.DATEONLY },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'in-service' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    retiredAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'cabinets' },
);

Area.hasMany(Cabinet, { foreignKey: 'areaId', as: 'cabinets' });
Cabinet.belongsTo(Area, { foreignKey: 'areaId', as: 'area' });
