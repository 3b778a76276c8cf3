import type { Adapter, AdapterPayload } from 'oidc-provider';
import pg from 'pg';
import {
  memoryFailedAttempts,
  postgresFailedAttempts,
  sweepFailedAttempts,
  type FailedAttemptStore,
} from './rate-limit';
import { survivePoolErrors } from '../../api/src/db/connection-errors';

/** Makes the provider's adapter for one model (Session, Interaction, Grant, AccessToken…). */
export type AdapterFactory = (model: string) => Adapter;

export interface ProviderStore {
  adapter: AdapterFactory;
  /** Failed sign-in attempts, kept where the records are (rate-limit.ts). */
  failedAttempts: FailedAttemptStore;
  close(): Promise<void>;
}

const epochSeconds = (date: Date) => Math.floor(date.getTime() / 1000);

/**
 * The provider's records in PostgreSQL (table identity_provider_records, migration 0005):
 * what keeps people signed in at the provider across restarts of `npm start`. Expired rows
 * are never returned and are swept at start and every hour.
 */
export function postgresStore(databaseUrl: string): ProviderStore {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: 4,
    idleTimeoutMillis: 10_000,
    connectionTimeoutMillis: 5_000,
    keepAlive: true,
  });
  // a PostgreSQL restart must not end the sign-in service: the pool reconnects by itself
  survivePoolErrors(pool, 'identity-provider');
  const sweep = () =>
    Promise.all([
      pool.query('DELETE FROM identity_provider_records WHERE expires_at < now()'),
      // a day covers any window and lockout the settings allow in practice
      sweepFailedAttempts(pool, 86_400_000),
    ]).catch(() => undefined);
  void sweep();
  const timer = setInterval(sweep, 3_600_000);
  timer.unref();

  const adapter: AdapterFactory = (model) => {
    const findWhere = async (column: 'id' | 'uid' | 'user_code', value: string) => {
      const { rows } = await pool.query<{ payload: AdapterPayload; consumed_at: Date | null }>(
        `SELECT payload, consumed_at FROM identity_provider_records
          WHERE model = $1 AND ${column} = $2 AND (expires_at IS NULL OR expires_at > now())`,
        [model, value],
      );
      const row = rows[0];
      if (!row) return undefined;
      return row.consumed_at
        ? { ...row.payload, consumed: epochSeconds(row.consumed_at) }
        : row.payload;
    };
    return {
      async upsert(id, payload, expiresIn) {
        await pool.query(
          `INSERT INTO identity_provider_records (model, id, payload, grant_id, user_code, uid, expires_at)
           VALUES ($1, $2, $3, $4, $5, $6, CASE WHEN $7::int IS NULL THEN NULL ELSE now() + make_interval(secs => $7::int) END)
           ON CONFLICT (model, id) DO UPDATE SET payload = EXCLUDED.payload, grant_id = EXCLUDED.grant_id,
             user_code = EXCLUDED.user_code, uid = EXCLUDED.uid, expires_at = EXCLUDED.expires_at`,
          [
            model,
            id,
            JSON.stringify(payload),
            payload.grantId ?? null,
            payload.userCode ?? null,
            payload.uid ?? null,
            typeof expiresIn === 'number' ? Math.ceil(expiresIn) : null,
          ],
        );
      },
      find: (id) => findWhere('id', id),
      findByUid: (uid) => findWhere('uid', uid),
      findByUserCode: (userCode) => findWhere('user_code', userCode),
      async consume(id) {
        await pool.query(
          'UPDATE identity_provider_records SET consumed_at = now() WHERE model = $1 AND id = $2',
          [model, id],
        );
      },
      async destroy(id) {
        await pool.query('DELETE FROM identity_provider_records WHERE model = $1 AND id = $2', [
          model,
          id,
        ]);
      },
      async revokeByGrantId(grantId) {
        await pool.query('DELETE FROM identity_provider_records WHERE grant_id = $1', [grantId]);
      },
    };
  };

  return {
    adapter,
    failedAttempts: postgresFailedAttempts(pool),
    async close() {
      clearInterval(timer);
      await pool.end();
    },
  };
}

/**
 * Records in this process's memory: for tests that run the provider without a database.
 * Everything is lost when the process ends, so never for `npm start`.
 */
export function memoryStore(): ProviderStore {
  const records = new Map<string, { payload: AdapterPayload; expiresAt: number | null }>();
  const key = (model: string, id: string) => `${model}\u0000${id}`;
  const live = (entry?: { payload: AdapterPayload; expiresAt: number | null }) =>
    entry && (entry.expiresAt === null || entry.expiresAt > Date.now()) ? entry.payload : undefined;
  const adapter: AdapterFactory = (model) => ({
    async upsert(id, payload, expiresIn) {
      records.set(key(model, id), {
        payload: { ...payload },
        expiresAt: expiresIn ? Date.now() + expiresIn * 1000 : null,
      });
    },
    find: async (id) => live(records.get(key(model, id))),
    async findByUid(uid) {
      for (const [k, entry] of records)
        if (k.startsWith(`${model}\u0000`) && entry.payload.uid === uid) return live(entry);
      return undefined;
    },
    async findByUserCode(userCode) {
      for (const [k, entry] of records)
        if (k.startsWith(`${model}\u0000`) && entry.payload.userCode === userCode)
          return live(entry);
      return undefined;
    },
    async consume(id) {
      const entry = records.get(key(model, id));
      if (entry) entry.payload.consumed = Math.floor(Date.now() / 1000);
    },
    async destroy(id) {
      records.delete(key(model, id));
    },
    async revokeByGrantId(grantId) {
      for (const [k, entry] of records) if (entry.payload.grantId === grantId) records.delete(k);
    },
  });
  return { adapter, failedAttempts: memoryFailedAttempts(), close: async () => records.clear() };
}
