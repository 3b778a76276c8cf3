import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { BankDesignVersion } from './bank-design-version';

/** A bank design's identity; its technical fields live in revisions (BankDesignVersion). */
export class BankDesign extends Model<InferAttributes<BankDesign>, InferCreationAttributes<BankDesign>> {
  declare id: CreationOptional<string>;
  declare code: string;
  declare name: string;
  declare notes: CreationOptional<string>;
  /** The revision new verdicts are judged with. */
  declare currentVersionId: string | null;
  declare version: CreationOptional<number>;
  declare retiredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare currentVersion?: NonAttribute<BankDesignVersion>;
}

BankDesign.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    code: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    currentVersionId: { type: DataTypes.UUID },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    retiredAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'bank_designs' },
);
