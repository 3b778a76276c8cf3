import { Router } from 'express';
import { databaseAnswers } from '../../db/sequelize';
import { allowPublic } from '../../middleware/require-role';
import { VERSION } from '../../version';

const startedAt = Date.now();

/** `GET /api/health`: public; 200 when the database answers, 503 when it does not. */
export const healthRouter = Router();

healthRouter.get('/', allowPublic, async (_req, res) => {
  const database = (await databaseAnswers()) ? 'up' : 'down';
  res.status(database === 'up' ? 200 : 503).json({
    status: database === 'up' ? 'ok' : 'unavailable',
    version: VERSION,
    database,
    uptimeSeconds: Math.round((Date.now() - startedAt) / 1000),
  });
});
