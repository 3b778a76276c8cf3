import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { BankStatus, BaselineSource } from '../../../shared/constants/register';
import { sequelize } from '../db/sequelize';
import { BankDesign } from './bank-design';
import { BankDesignVersion } from './bank-design-version';
import { Cabinet } from './cabinet';
import { User } from './user';

/**
 * One DC-link bank in a cabinet, of a bank design, with its baseline. A replaced bank keeps
 * its record (status `replaced`, pointing at its successor); the successor starts a new baseline.
 */
export class Bank extends Model<InferAttributes<Bank>, InferCreationAttributes<Bank>> {
  declare id: CreationOptional<string>;
  declare cabinetId: ForeignKey<Cabinet['id']>;
  declare bankDesignId: ForeignKey<BankDesign['id']>;
  declare position: string;
  declare serialNumber: CreationOptional<string>;
  declare installedOn: string | null;
  declare notes: CreationOptional<string>;
  declare status: CreationOptional<BankStatus>;
  declare baselineTauSeconds: number;
  declare baselineCapacitanceMicrofarads: number;
  declare baselineSource: BaselineSource;
  declare baselineSetAt: Date;
  declare baselineSetById: ForeignKey<User['id']> | null;
  declare baselineDesignVersionId: ForeignKey<BankDesignVersion['id']> | null;
  declare baselineDecayRunId: string | null;
  declare baselineNote: CreationOptional<string>;
  declare replacesBankId: string | null;
  declare replacedByBankId: string | null;
  declare replacedOn: string | null;
  declare version: CreationOptional<number>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare cabinet?: NonAttribute<Cabinet>;
  declare bankDesign?: NonAttribute<BankDesign>;
  declare baselineSetBy?: NonAttribute<User | null>;
  declare baselineDesignVersion?: NonAttribute<BankDesignVersion | null>;
}

Bank.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    position: { type: DataTypes.TEXT, allowNull: false },
    serialNumber: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    installedOn: { type: DataTypes.DATEONLY },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'in-service' },
    baselineTauSeconds: { type: DataTypes.DOUBLE, allowNull: false },
    baselineCapacitanceMicrofarads: { type: DataTypes.DOUBLE, allowNull: false },
    baselineSource: { type: DataTypes.TEXT, allowNull: false },
    baselineSetAt: { type: DataTypes.DATE, allowNull: false },
    baselineDecayRunId: { type: DataTypes.UUID },
    baselineNote: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    replacesBankId: { type: DataTypes.UUID },
    replacedByBankId: { type: DataTypes.UUID },
    replacedOn: { type: DataTypes.DATEONLY },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    retiredAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'banks' },
);

Cabinet.hasMany(Bank, { foreignKey: 'cabinetId', as: 'banks' });
Bank.belongsTo(Cabinet, { foreignKey: 'cabinetId', as: 'cabinet' });
BankDesign.hasMany(Bank, { foreignKey: 'bankDesignId', as: 'banks' });
Bank.belongsTo(BankDesign, { foreignKey: 'bankDesignId', as: 'bankDesign' });
Bank.belongsTo(User, { foreignKey: 'baselineSetById', as: 'baselineSetBy' });
Bank.belongsTo(BankDesignVersion, { foreignKey: 'baselineDesignVersionId', as: 'baselineDesignVersion' });
