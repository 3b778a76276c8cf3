import { Router } from 'express';
import { accessEventsQuerySchema } from '../../../../shared/schemas/access-event';
import { requireRole } from '../../middleware/require-role';
import { listAccessEvents } from '../../services/access-events';
import { presentAccessEvent } from './presenter';

/** `GET /api/access-events`: the sign-in log, newest first (admins). */
export const accessEventsRouter = Router();

accessEventsRouter.get('/', requireRole('admin'), async (req, res) => {
  const query = accessEventsQuerySchema.parse(req.query);
  const events = await listAccessEvents(query);
  res.json({ items: events.map(presentAccessEvent) });
});
