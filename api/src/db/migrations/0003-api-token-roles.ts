import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/**
 * A token may be narrowed to some of its owner's roles (e.g. a logger gateway that only
 * uploads readings). Null means "whatever roles the owner holds at the time of use".
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn('api_tokens', 'roles', { type: DataTypes.ARRAY(DataTypes.TEXT) });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn('api_tokens', 'roles');
};
