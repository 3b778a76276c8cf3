import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import type { AuditAction, RegisterEntityType } from '../../../shared/constants/register';
import { sequelize } from '../db/sequelize';
import { User } from './user';

/** One create, change or retirement of a register record, with the values before and after. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<string>;
  declare entityType: RegisterEntityType;
  declare entityId: string;
  declare action: AuditAction;
  declare actorId: ForeignKey<User['id']> | null;
  declare actorName: string | null;
  declare summary: CreationOptional<string>;
  declare before: Record<string, unknown> | null;
  declare after: Record<string, unknown> | null;
  declare at: CreationOptional<Date>;
}

AuditEntry.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    entityType: { type: DataTypes.TEXT, allowNull: false },
    entityId: { type: DataTypes.UUID, allowNull: false },
    action: { type: DataTypes.TEXT, allowNull: false },
    actorName: { type: DataTypes.TEXT },
    summary: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    before: { type: DataTypes.JSONB },
    after: { type: DataTypes.JSONB },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  },
  { sequelize, tableName: 'audit_entries', timestamps: false },
);

AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
