import { isRole } from '../../../../shared/constants/roles';
import type { ApiTokenView } from '../../../../shared/schemas/api-token';
import type { ApiToken } from '../../models/api-token';
import { apiTokenStatus } from '../../services/api-tokens';

export function presentApiToken(token: ApiToken, now = new Date()): ApiTokenView {
  return {
    id: token.id,
    name: token.name,
    roles: token.roles ? token.roles.filter(isRole) : null,
    status: apiTokenStatus(token, now),
    expiresAt: token.expiresAt.toISOString(),
    lastUsedAt: token.lastUsedAt?.toISOString() ?? null,
    revokedAt: token.revokedAt?.toISOString() ?? null,
    createdAt: token.createdAt.toISOString(),
  };
}
