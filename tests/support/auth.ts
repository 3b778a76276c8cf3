import crypto from 'node:crypto';
import type { Role } from '../../shared/constants/roles';
import { User } from '../../api/src/models/user';
import { issueApiToken } from '../../api/src/services/api-tokens';

export interface TestCaller {
  user: User;
  /** `Authorization` header value for supertest: `.set('Authorization', caller.auth)`. */
  auth: string;
}

/** A user holding `roles`, with an API token valid for a day, for API tests. */
export async function createCaller(roles: Role[], name = roles.join('+') || 'no-role'): Promise<TestCaller> {
  const tag = crypto.randomBytes(4).toString('hex');
  const user = await User.create({
    email: `${name}-${tag}@test.example`,
    name: `Test ${name}`,
    roles,
    subject: `test-${tag}`,
    lastSignInAt: null,
  });
  const { secret } = await issueApiToken(user.id, 'test', new Date(Date.now() + 86_400_000));
  return { user, auth: `Bearer ${secret}` };
}
