import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

/** Who signed in, out, failed to, or had their access changed: when and from where. */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable('access_events', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    // sign-in, sign-out, sign-in-failed, roles-changed, deactivated, reactivated, …
    kind: { type: DataTypes.TEXT, allowNull: false },
    // the person the event is about; null when a failed sign-in names no known person
    user_id: {
      type: DataTypes.UUID,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    // who did it when that is someone else (an admin changing roles)
    actor_id: {
      type: DataTypes.UUID,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    // the login typed at a failed sign-in, kept as typed
    login: { type: DataTypes.TEXT },
    ip: { type: DataTypes.TEXT },
    user_agent: { type: DataTypes.TEXT },
    detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('access_events', ['created_at']);
  await qi.addIndex('access_events', ['user_id', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('access_events');
};
