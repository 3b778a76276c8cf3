import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import type { VisitState } from '../../../shared/domain/visit-states';
import type { PlanningOverride } from '../../../shared/schemas/visit';
import { sequelize } from '../db/sequelize';
import { Bank } from './bank';
import { Cabinet } from './cabinet';
import { User } from './user';

/**
 * A visit: one or more banks of one cabinet, planned between two instants and assigned to one
 * or more technicians; its state moves by the rules of shared/domain/visit-states.ts.
 */
export class Visit extends Model<InferAttributes<Visit>, InferCreationAttributes<Visit>> {
  declare id: CreationOptional<string>;
  declare cabinetId: ForeignKey<Cabinet['id']>;
  declare plannedStartAt: Date;
  declare plannedEndAt: Date;
  declare state: CreationOptional<VisitState>;
  declare unplanned: CreationOptional<boolean>;
  declare notes: CreationOptional<string>;
  declare overrides: CreationOptional<PlanningOverride[]>;
  declare stateReason: CreationOptional<string>;
  declare startedAt: CreationOptional<Date | null>;
  declare loggedAt: CreationOptional<Date | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare missedAt: CreationOptional<Date | null>;
  declare cancelledAt: CreationOptional<Date | null>;
  declare createdById: ForeignKey<User['id']> | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare cabinet?: NonAttribute<Cabinet>;
  declare banks?: NonAttribute<Bank[]>;
  declare technicians?: NonAttribute<User[]>;
  /** Per bank id: its current runs on this visit and τ of its newest accepted run (set by the visits service). */
  declare decayRunFigures?: NonAttribute<ReadonlyMap<string, { lastTauSeconds: number | null; runCount: number }>>;
}

Visit.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    plannedStartAt: { type: DataTypes.DATE, allowNull: false },
    plannedEndAt: { type: DataTypes.DATE, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'planned' },
    unplanned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    overrides: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    stateReason: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    startedAt: { type: DataTypes.DATE },
    loggedAt: { type: DataTypes.DATE },
    reviewedAt: { type: DataTypes.DATE },
    missedAt: { type: DataTypes.DATE },
    cancelledAt: { type: DataTypes.DATE },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'visits' },
);

Cabinet.hasMany(Visit, { foreignKey: 'cabinetId', as: 'visits' });
Visit.belongsTo(Cabinet, { foreignKey: 'cabinetId', as: 'cabinet' });
Visit.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
