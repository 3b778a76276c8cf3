import { Router } from 'express';
import { z } from 'zod';
import { peopleQuerySchema, personUpdateSchema } from '../../../../shared/schemas/person';
import { requestOrigin } from '../../middleware/request-origin';
import { requireRole, requireSignedIn } from '../../middleware/require-role';
import { getPerson, listAdmins, listPeople, sitesOfPeople, updatePerson } from '../../services/people';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser } from '../params';
import { presentAdminContact, presentPerson } from './presenter';

/** `/api/people`: the users of Ebbline and their roles (admins), and whom to ask for access. */
export const peopleRouter = Router();

const personParams = z.object({ userId: z.uuid({ error: 'userId must be a person id' }) });

peopleRouter.get('/', requireRole('admin'), async (req, res) => {
  const query = peopleQuerySchema.parse(req.query);
  const people = await listPeople(query);
  const sites = await sitesOfPeople(people.map((p) => p.id));
  res.json({ items: people.map((p) => presentPerson(p, sites.get(p.id) ?? [])) });
});

/** For the "waiting for access" page: any signed-in person, even without a role. */
peopleRouter.get('/admins', requireSignedIn, async (_req, res) => {
  const admins = await listAdmins();
  res.json({ items: admins.map(presentAdminContact) });
});

peopleRouter.get('/:userId', requireRole('admin'), async (req, res) => {
  const { userId } = personParams.parse(req.params);
  const person = await getPerson(userId);
  const sites = await sitesOfPeople([person.id]);
  res.json(presentPerson(person, sites.get(person.id) ?? []));
});

peopleRouter.patch('/:userId', requireRole('admin'), async (req, res) => {
  const { userId } = personParams.parse(req.params);
  const change = personUpdateSchema.parse(req.body ?? {});
  const origin = requestOrigin(req);
  const person = await withUnitOfWork(actingUser(req), (uow) => updatePerson(uow, userId, change, origin));
  const sites = await sitesOfPeople([person.id]);
  res.json(presentPerson(person, sites.get(person.id) ?? []));
});
