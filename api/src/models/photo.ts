import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import { sequelize } from '../db/sequelize';
import { Bank } from './bank';
import { User } from './user';
import { Visit } from './visit';

/**
 * A photo of a visit (optionally of one of its banks). The files are in the photo store under
 * `storageKey` (full size) and `thumbnailKey`, never under the name they were uploaded with.
 */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<string>;
  declare clientId: string;
  declare visitId: ForeignKey<Visit['id']>;
  declare bankId: ForeignKey<Bank['id']> | null;
  declare caption: string;
  declare storageKey: string;
  declare thumbnailKey: string;
  declare widthPx: number;
  declare heightPx: number;
  declare bytes: number;
  declare takenById: ForeignKey<User['id']>;
  declare createdAt: Date;
  declare takenBy?: NonAttribute<User>;
}

Photo.init(
  {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
    bankId: { type: DataTypes.UUID },
    caption: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    storageKey: { type: DataTypes.TEXT, allowNull: false },
    thumbnailKey: { type: DataTypes.TEXT, allowNull: false },
    widthPx: { type: DataTypes.INTEGER, allowNull: false },
    heightPx: { type: DataTypes.INTEGER, allowNull: false },
    bytes: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  },
  // created_at is the unit of work's instant, set by the service; a photo is never changed
  { sequelize, tableName: 'photos', timestamps: false },
);

Visit.hasMany(Photo, { foreignKey: 'visitId', as: 'photos' });
Photo.belongsTo(Visit, { foreignKey: 'visitId', as: 'visit' });
Photo.belongsTo(User, { foreignKey: 'takenById', as: 'takenBy' });
