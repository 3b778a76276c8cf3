import type { Migration } from '../migrator';

/**
 * The outbox: messages a write leaves for the jobs that act on it later (alerts, mail),
 * written in the write's own transaction, so a message exists exactly when its change does.
 * Nothing reads it yet. The app's role gets ordinary rights on it like on any table (see
 * db/app-role.ts): a job marks a message processed once it has acted on it.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE outbox_messages (
      -- the order the messages were written in, also within one unit of work
      id bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
      -- what happened, dotted kebab-case words: "decay-run.recorded"
      topic text NOT NULL CHECK (topic ~ '^[a-z][a-z0-9-]*(\\.[a-z][a-z0-9-]*)+$'),
      payload jsonb NOT NULL DEFAULT '{}',
      actor_id uuid REFERENCES users (id) ON DELETE SET NULL,
      -- the unit of work's instant
      enqueued_at timestamptz NOT NULL,
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      last_error text,
      processed_at timestamptz
    );
    CREATE INDEX outbox_messages_pending ON outbox_messages (id) WHERE processed_at IS NULL;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable('outbox_messages');
};
