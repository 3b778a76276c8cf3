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
import { seedDecayHistory, type DecayHistorySeedSummary } from './decay-history';
import { DEMO_PEOPLE } from './people';
import { seedPlanner, type PlannerSeedSummary } from './planner';
import {
  DEMO_AREA_NAMES,
  seedRegister,
  type RegisterSeedOptions,
  type RegisterSeedSummary,
} from './register';

export interface SeedSummary
  extends Partial<RegisterSeedSummary>,
    Partial<PlannerSeedSummary>,
    Partial<DecayHistorySeedSummary> {
  /** People registered ahead of their first sign-in. */
  people: number;
}

export interface SeedOptions extends RegisterSeedOptions {
  /** The seed's instant, which every demo date counts from (default: the clock's). */
  now?: Date;
}

/** Seeds the demo scenario in one unit of work, acting as Ebbline itself (its audit entries name the demo people). */
export async function seedDemo(options: SeedOptions = {}): Promise<SeedSummary> {
  return withUnitOfWork(
    null,
    async (uow) => {
      const { transaction } = uow;
      // the local provider's `sub` is the login, so a seeded person is found at their first sign-in
      const registered = DEMO_PEOPLE.filter((p) => !p.joinsAtFirstSignIn);
      for (const person of registered) {
        await User.findOrCreate({
          where: { email: person.email },
          // one registered by e-mail only is linked to the provider's account at the first sign-in
          defaults: {
            email: person.email,
            name: person.name,
            roles: person.roles,
            subject: person.registeredByEmail ? null : person.login,
            lastSignInAt: null,
          },
          transaction,
        });
      }
      const register = await seedRegister(uow, options);
      const planner = await seedPlanner(uow, DEMO_AREA_NAMES);
      // after the Planner's visits: the history ends before them and their runs go into them
      const history = await seedDecayHistory(uow, DEMO_AREA_NAMES);
      return { people: registered.length, ...register, ...planner, ...history };
    },
    { now: options.now },
  );
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
