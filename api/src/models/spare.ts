import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { SpareKind, SpareStatus } from '../../../shared/constants/register';
import { sequelize } from '../db/sequelize';
import { BankDesign } from './bank-design';
import { Site } from './site';

/** A spare drive or bank in store, with its reforming due date. */
export class Spare extends Model<InferAttributes<Spare>, InferCreationAttributes<Spare>> {
  declare id: CreationOptional<string>;
  declare code: string;
  declare kind: SpareKind;
  declare description: string;
  declare siteId: ForeignKey<Site['id']>;
  declare bankDesignId: ForeignKey<BankDesign['id']> | null;
  declare storageLocation: CreationOptional<string>;
  declare storageStartedOn: string;
  declare lastReformedOn: string | null;
  declare reformingIntervalDays: number;
  /** Kept by the service: (lastReformedOn or storageStartedOn) + reformingIntervalDays. */
  declare reformingDueOn: string;
  declare status: CreationOptional<SpareStatus>;
  declare notes: CreationOptional<string>;
  declare version: CreationOptional<number>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare site?: NonAttribute<Site>;
  declare bankDesign?: NonAttribute<BankDesign | null>;
}

Spare.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    code: { type: DataTypes.TEXT, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    storageLocation: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    storageStartedOn: { type: DataTypes.DATEONLY, allowNull: false },
    lastReformedOn: { type: DataTypes.DATEONLY },
    reformingIntervalDays: { type: DataTypes.INTEGER, allowNull: false },
    reformingDueOn: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'in-store' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    retiredAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'spares' },
);

Site.hasMany(Spare, { foreignKey: 'siteId', as: 'spares' });
Spare.belongsTo(Site, { foreignKey: 'siteId', as: 'site' });
BankDesign.hasMany(Spare, { foreignKey: 'bankDesignId', as: 'spares' });
Spare.belongsTo(BankDesign, { foreignKey: 'bankDesignId', as: 'bankDesign' });
