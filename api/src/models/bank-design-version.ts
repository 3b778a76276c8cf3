import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { CapacitorTechnology } from '../../../shared/constants/health';
import { sequelize } from '../db/sequelize';
import { BankDesign } from './bank-design';
import { User } from './user';

/**
 * One immutable revision of a bank design's technical fields. Verdicts point at the revision
 * they were judged with, so editing a design never changes an old verdict's limits.
 */
export class BankDesignVersion extends Model<
  InferAttributes<BankDesignVersion>,
  InferCreationAttributes<BankDesignVersion>
> {
  declare id: CreationOptional<string>;
  declare bankDesignId: ForeignKey<BankDesign['id']>;
  declare revision: number;
  declare technology: CapacitorTechnology;
  declare unitCapacitanceMicrofarads: number;
  declare unitRatedVolts: number;
  declare seriesCount: number;
  declare parallelCount: number;
  declare bleederOhms: number;
  declare capacitanceTolerancePercent: number;
  declare tempCoefficientPercentPerKelvin: number;
  declare ratedLifeHours: number;
  declare ratedLifeCelsius: number;
  declare watchRatio: number;
  declare endOfLifeRatio: number;
  declare inspectionIntervalDays: number;
  declare changeNote: CreationOptional<string>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare createdBy?: NonAttribute<User | null>;
}

BankDesignVersion.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    revision: { type: DataTypes.INTEGER, allowNull: false },
    technology: { type: DataTypes.TEXT, allowNull: false },
    unitCapacitanceMicrofarads: { type: DataTypes.DOUBLE, allowNull: false },
    unitRatedVolts: { type: DataTypes.DOUBLE, allowNull: false },
    seriesCount: { type: DataTypes.INTEGER, allowNull: false },
    parallelCount: { type: DataTypes.INTEGER, allowNull: false },
    bleederOhms: { type: DataTypes.DOUBLE, allowNull: false },
    capacitanceTolerancePercent: { type: DataTypes.DOUBLE, allowNull: false },
    tempCoefficientPercentPerKelvin: { type: DataTypes.DOUBLE, allowNull: false },
    ratedLifeHours: { type: DataTypes.INTEGER, allowNull: false },
    ratedLifeCelsius: { type: DataTypes.DOUBLE, allowNull: false },
    watchRatio: { type: DataTypes.DOUBLE, allowNull: false },
    endOfLifeRatio: { type: DataTypes.DOUBLE, allowNull: false },
    inspectionIntervalDays: { type: DataTypes.INTEGER, allowNull: false },
    changeNote: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'bank_design_versions', updatedAt: false },
);

BankDesign.hasMany(BankDesignVersion, { foreignKey: 'bankDesignId', as: 'versions' });
BankDesignVersion.belongsTo(BankDesign, { foreignKey: 'bankDesignId', as: 'bankDesign' });
BankDesign.belongsTo(BankDesignVersion, { foreignKey: 'currentVersionId', as: 'currentVersion', constraints: false });
BankDesignVersion.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
