import { Router } from 'express';
import { z } from 'zod';
import { apiTokenInputSchema, type IssuedApiToken } from '../../../../shared/schemas/api-token';
import { requestOrigin } from '../../middleware/request-origin';
import { requireAnyRole, requireSessionCaller } from '../../middleware/require-role';
import { createApiToken, listApiTokens, revokeApiToken } from '../../services/api-tokens';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser } from '../params';
import { presentApiToken } from './presenter';

/**
 * `/api/me/tokens`: a person's own API tokens. Managed from a signed-in browser only: a
 * token cannot make or revoke tokens.
 */
export const apiTokensRouter = Router();

const tokenParams = z.object({ tokenId: z.uuid({ error: 'tokenId must be a token id' }) });

apiTokensRouter.get('/', requireAnyRole, requireSessionCaller, async (req, res) => {
  const tokens = await listApiTokens(req.user!.id);
  res.json({ items: tokens.map((t) => presentApiToken(t)) });
});

apiTokensRouter.post('/', requireAnyRole, requireSessionCaller, async (req, res) => {
  const input = apiTokenInputSchema.parse(req.body ?? {});
  const origin = requestOrigin(req);
  const { token, secret } = await withUnitOfWork(actingUser(req), (uow) => createApiToken(uow, input, origin));
  const body: IssuedApiToken = { ...presentApiToken(token), secret };
  res.status(201).json(body);
});

apiTokensRouter.delete('/:tokenId', requireAnyRole, requireSessionCaller, async (req, res) => {
  const { tokenId } = tokenParams.parse(req.params);
  const origin = requestOrigin(req);
  const token = await withUnitOfWork(actingUser(req), (uow) => revokeApiToken(uow, tokenId, origin));
  res.json(presentApiToken(token));
});
