/** API tokens: named bearer secrets for scripts and logger gateways, made on the profile page. */
import { z } from 'zod';
import { ROLES, type Role } from '../constants/roles';
import { storableString } from './common';

/** The expiries the profile page offers, in days; the API accepts any from 1 to 365. */
export const API_TOKEN_EXPIRY_DAYS = [7, 30, 90, 365] as const;

export const apiTokenInputSchema = z.object({
  name: storableString('token name', 'Enter a name for the token.')
    .trim()
    .min(1, 'Enter a name for the token.')
    .max(80, 'Keep the name under 80 characters.'),
  expiresInDays: z
    .number({ error: 'Choose how many days the token lasts.' })
    .int('Enter whole days.')
    .min(1, 'A token lasts at least 1 day.')
    .max(365, 'A token lasts at most 365 days.'),
  /** Narrow the token to some of your roles; null (the default) acts with all of them. */
  roles: z
    .array(z.enum(ROLES, { error: `A role is one of: ${ROLES.join(', ')}.` }))
    .min(1, 'Choose at least one role, or leave the roles out.')
    .transform((roles) => ROLES.filter((r) => roles.includes(r)))
    .nullable()
    .default(null),
});
export type ApiTokenInput = z.input<typeof apiTokenInputSchema>;
export type ApiTokenData = z.output<typeof apiTokenInputSchema>;

export type ApiTokenStatus = 'active' | 'expired' | 'revoked';

/** A token as its owner's list shows it; the secret is never in here. */
export interface ApiTokenView {
  id: string;
  name: string;
  roles: Role[] | null;
  status: ApiTokenStatus;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  createdAt: string;
}

/** The answer to creating a token: the only time the secret is shown. */
export interface IssuedApiToken extends ApiTokenView {
  secret: string;
}
