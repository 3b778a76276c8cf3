import { DataTypes, Model, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

/** A site a person works at (table `person_sites`): a technician reads every visit of their sites. */
export class PersonSite extends Model<InferAttributes<PersonSite>, InferCreationAttributes<PersonSite>> {
  declare userId: string;
  declare siteId: string;
}

PersonSite.init(
  {
    userId: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
    siteId: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
  },
  { sequelize, tableName: 'person_sites', timestamps: false },
);
