import { Router } from 'express';
import { DATABASE_RETRY_AFTER_SECONDS } from '../../db/connection-errors';
import { databaseAnswers } from '../../db/sequelize';
import { isStopping } from '../../lifecycle';
import { allowPublic } from '../../middleware/require-role';
import { VERSION } from '../../version';

const startedAt = Date.now();

/**
 * `GET /api/health`: public readiness. 200 when the database answers; 503 (with Retry-After)
 * when it does not, and from the moment the process begins to stop.
 */
export const healthRouter = Router();

healthRouter.get('/', allowPublic, async (_req, res) => {
  const database = (await databaseAnswers()) ? 'up' : 'down';
  const status = isStopping() ? 'stopping' : database === 'up' ? 'ok' : 'unavailable';
  if (status !== 'ok') res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
  res.status(status === 'ok' ? 200 : 503).json({
    status,
    version: VERSION,
    database,
    uptimeSeconds: Math.round((Date.now() - startedAt) / 1000),
  });
});
