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

/** A named bearer token for scripts and logger gateways; acts with its owner's roles. */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare name: string;
  declare tokenHash: string;
  /** Narrows the token to some of its owner's roles; null: all the owner holds at each use. */
  declare roles: string[] | null;
  declare expiresAt: Date;
  declare lastUsedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ApiToken.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    name: { type: DataTypes.TEXT, allowNull: false },
    tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    roles: { type: DataTypes.ARRAY(DataTypes.TEXT) },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    lastUsedAt: { type: DataTypes.DATE },
    revokedAt: { type: DataTypes.DATE },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'api_tokens' },
);

User.hasMany(ApiToken, { foreignKey: 'userId', as: 'apiTokens' });
ApiToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });
