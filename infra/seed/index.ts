/**
 * The demo scenario, seeded by `npm start`. Deterministic and idempotent: a second run
 * finds every record by its natural key and adds nothing.
 *
 *   tsx infra/seed/index.ts        (against DATABASE_URL)
 */
import { pathToFileURL } from 'node:url';
import { User } from '../../api/src/models/user';
import { sequelize } from '../../api/src/db/sequelize';
import { DEMO_PEOPLE } from './people';

export interface SeedSummary {
  people: number;
}

/** Seeds the demo scenario in one transaction. */
export async function seedDemo(): Promise<SeedSummary> {
  return sequelize.transaction(async (transaction) => {
    // the local provider's `sub` is the login, so a seeded person is found at their first sign-in
    for (const person of DEMO_PEOPLE.filter((p) => !p.joinsAtFirstSignIn)) {
      await User.findOrCreate({
        where: { email: person.email },
        defaults: { email: person.email, name: person.name, roles: person.roles, subject: person.login, lastSignInAt: null },
        transaction,
      });
    }
    return { people: DEMO_PEOPLE.length };
  });
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  console.log(await seedDemo());
  await sequelize.close();
}
