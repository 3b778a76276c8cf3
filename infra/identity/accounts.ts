import bcrypt from 'bcryptjs';
import type { DemoPerson } from '../seed/people';

/** A staff account of the local provider: what its ID token says about the person. */
export interface StaffAccount {
  /** The `sub` claim: the login, stable for the demo and known to the seed. */
  subject: string;
  name: string;
  email: string;
  /** The directory's roles, sent as the `roles` claim. */
  roles: string[];
}

export interface AccountStore {
  find(subject: string): StaffAccount | undefined;
  /** The account when login and password match; null otherwise (same work either way). */
  verify(login: string, password: string): Promise<StaffAccount | null>;
}

/**
 * Hashes the staff's passwords with bcrypt once at start; plain passwords are not kept.
 * @param rounds bcrypt cost; 10 for `npm start`, lower in tests
 */
export async function createAccountStore(
  people: readonly DemoPerson[],
  rounds = 10,
): Promise<AccountStore> {
  const accounts = new Map<string, { account: StaffAccount; passwordHash: string }>();
  for (const person of people) {
    accounts.set(person.login.toLowerCase(), {
      account: {
        subject: person.login,
        name: person.name,
        email: person.email,
        roles: [...person.roles],
      },
      passwordHash: await bcrypt.hash(person.password, rounds),
    });
  }
  // compared against for unknown logins, so that a wrong login costs what a wrong password does
  const decoy = await bcrypt.hash('no account has this password', rounds);
  return {
    find: (subject) => accounts.get(subject.toLowerCase())?.account,
    async verify(login, password) {
      const entry = accounts.get(login.trim().toLowerCase());
      const matches = await bcrypt.compare(password, entry?.passwordHash ?? decoy);
      return entry && matches ? entry.account : null;
    },
  };
}
