import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { User } from './user';

/** A message a write left for a later job (alerts, mail), written in the write's transaction. */
export class OutboxMessage extends Model<
  InferAttributes<OutboxMessage>,
  InferCreationAttributes<OutboxMessage>
> {
  /** bigint: PostgreSQL's driver gives it as a string. */
  declare id: CreationOptional<string>;
  declare topic: string;
  declare payload: Record<string, unknown>;
  declare actorId: ForeignKey<User['id']> | null;
  declare enqueuedAt: Date;
  declare attempts: CreationOptional<number>;
  declare lastError: CreationOptional<string | null>;
  declare processedAt: CreationOptional<Date | null>;
}

OutboxMessage.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    topic: { type: DataTypes.TEXT, allowNull: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    enqueuedAt: { type: DataTypes.DATE, allowNull: false },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastError: { type: DataTypes.TEXT },
    processedAt: { type: DataTypes.DATE },
  },
  { sequelize, tableName: 'outbox_messages', timestamps: false },
);

OutboxMessage.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
