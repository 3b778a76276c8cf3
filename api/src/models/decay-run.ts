import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { ReviewState, RunSource } from '../../../shared/constants/decay-runs';
import type { HealthName } from '../../../shared/constants/health';
import type { RecordedRunVerdict } from '../../../shared/domain/recorded-run';
import type { DecayRunObservations, DecayRunSafety } from '../../../shared/schemas/decay-run';
import { sequelize } from '../db/sequelize';
import { Bank } from './bank';
import { User } from './user';
import { Visit } from './visit';

/**
 * One recorded decay run on one bank during a visit: the readings exactly as sent, the safety
 * checks, the observations and the server's verdict. Never edited: a correction is a new row
 * (`version` + 1) that supersedes it. Only the review columns change after it is stored.
 */
export class DecayRun extends Model<InferAttributes<DecayRun>, InferCreationAttributes<DecayRun>> {
  declare id: CreationOptional<string>;
  declare clientId: string;
  declare visitId: ForeignKey<Visit['id']>;
  declare bankId: ForeignKey<Bank['id']>;
  declare version: number;
  declare supersedesId: string | null;
  declare correctionReason: string | null;
  declare source: RunSource;
  declare loggerFileName: string | null;
  declare isolatedAt: Date;
  declare samples: { tSeconds: number; volts: number }[];
  declare safety: DecayRunSafety;
  declare observations: DecayRunObservations;
  declare verdict: RecordedRunVerdict;
  declare health: HealthName | null;
  declare tauSeconds: number | null;
  declare capacitanceRatio: number | null;
  declare safetyFinding: boolean;
  declare bodySha256: string;
  declare reviewState: CreationOptional<ReviewState>;
  declare reviewComment: CreationOptional<string>;
  declare reviewedById: ForeignKey<User['id']> | null;
  declare reviewedAt: CreationOptional<Date | null>;
  declare recordedById: ForeignKey<User['id']>;
  declare recordedAt: Date;
  declare bank?: NonAttribute<Bank>;
  declare visit?: NonAttribute<Visit>;
  declare recordedBy?: NonAttribute<User>;
  declare reviewedBy?: NonAttribute<User | null>;
  /** The version that corrects this one, when loaded. */
  declare supersededBy?: NonAttribute<DecayRun | null>;
}

DecayRun.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clientId: { type: DataTypes.UUID, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    supersedesId: { type: DataTypes.UUID },
    correctionReason: { type: DataTypes.TEXT },
    source: { type: DataTypes.TEXT, allowNull: false },
    loggerFileName: { type: DataTypes.TEXT },
    isolatedAt: { type: DataTypes.DATE, allowNull: false },
    samples: { type: DataTypes.JSONB, allowNull: false },
    safety: { type: DataTypes.JSONB, allowNull: false },
    observations: { type: DataTypes.JSONB, allowNull: false },
    verdict: { type: DataTypes.JSONB, allowNull: false },
    health: { type: DataTypes.TEXT },
    tauSeconds: { type: DataTypes.DOUBLE },
    capacitanceRatio: { type: DataTypes.DOUBLE },
    safetyFinding: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    bodySha256: { type: DataTypes.TEXT, allowNull: false },
    reviewState: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
    reviewComment: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    reviewedAt: { type: DataTypes.DATE },
    recordedAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: 'decay_runs', timestamps: false },
);

Visit.hasMany(DecayRun, { foreignKey: 'visitId', as: 'decayRuns' });
DecayRun.belongsTo(Visit, { foreignKey: 'visitId', as: 'visit' });
Bank.hasMany(DecayRun, { foreignKey: 'bankId', as: 'decayRuns' });
DecayRun.belongsTo(Bank, { foreignKey: 'bankId', as: 'bank' });
DecayRun.belongsTo(User, { foreignKey: 'recordedById', as: 'recordedBy' });
DecayRun.belongsTo(User, { foreignKey: 'reviewedById', as: 'reviewedBy' });
DecayRun.hasOne(DecayRun, { foreignKey: 'supersedesId', as: 'supersededBy' });
