/**
 * The demo scenario, seeded by `npm start`. Deterministic and idempotent: a second run
 * finds every record by its natural key and adds nothing.
 *
 *   tsx infra/seed/index.ts                   (against DATABASE_URL)
 *   tsx infra/seed/index.ts --cabinets 20000  (a large fleet, for measuring the register)
 */
import { pathToFileURL } from 'node:url';
import { User } from '../../api/src/models/user';
import { sequelize } from '../../api/src/db/sequelize';
import { withUnitOfWork } from '../../api/src/services/unit-of-work';
import { DEMO_PEOPLE } from './people';
import { seedRegister, type RegisterSeedOptions, type RegisterSeedSummary } from './register';

export interface SeedSummary extends Partial<RegisterSeedSummary> {
  /** People registered ahead of their first sign-in. */
  people: number;
}

export type SeedOptions = RegisterSeedOptions;

/** Seeds the demo scenario in one unit of work, acting as Ebbline itself (its audit entries name the demo people). */
export async function seedDemo(options: SeedOptions = {}): Promise<SeedSummary> {
  return withUnitOfWork(null, async (uow) => {
    const { transaction } = uow;
    // the local provider's `sub` is the login, so a seeded person is found at their first sign-in
    const registered = DEMO_PEOPLE.filter((p) => !p.joinsAtFirstSignIn);
    for (const person of registered) {
      await User.findOrCreate({
        where: { email: person.email },
        defaults: { email: person.email, name: person.name, roles: person.roles, subject: person.login, lastSignInAt: null },
        transaction,
      });
    }
    const register = await seedRegister(uow, options);
    return { people: registered.length, ...register };
  });
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const at = process.argv.indexOf('--cabinets');
  const cabinets = at >= 0 ? Number(process.argv[at + 1]) : undefined;
  if (cabinets !== undefined && !(Number.isInteger(cabinets) && cabinets > 0)) {
    console.error('usage: tsx infra/seed/index.ts [--cabinets N]   (N a whole number of cabinets)');
    process.exit(2);
  }
  console.log(await seedDemo({ cabinets }));
  await sequelize.close();
}
