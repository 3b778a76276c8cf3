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

/**
 * A person's calendar feed: the secret address their calendar app subscribes to for their
 * visits. Only the secret's SHA-256 is kept; at most one feed per person is in use.
 */
export class CalendarFeed extends Model<
  InferAttributes<CalendarFeed>,
  InferCreationAttributes<CalendarFeed>
> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare tokenHash: string;
  declare createdAt: Date;
  declare revokedAt: Date | null;
  declare lastUsedAt: Date | null;
}

CalendarFeed.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    revokedAt: { type: DataTypes.DATE },
    lastUsedAt: { type: DataTypes.DATE },
  },
  // created_at is the unit of work's instant, set by the service; no updated_at
  { sequelize, tableName: 'calendar_feeds', timestamps: false },
);

User.hasMany(CalendarFeed, { foreignKey: 'userId', as: 'calendarFeeds' });
CalendarFeed.belongsTo(User, { foreignKey: 'userId', as: 'user' });
