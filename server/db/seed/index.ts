import { eq } from 'drizzle-orm';
import type { Auth } from '../../auth/auth';
import type { Config } from '../../config/env';
import type { Logger } from '../../logger';
import type { Database, Db } from '../client';
import { customerContacts, customers, seedRuns } from '../schema';
import { createLabRepository } from '../../modules/lab/lab.repository';
import { createCustomersRepository } from '../../modules/customers/customers.repository';
import { createUsersRepository } from '../../modules/users/users.repository';
import { createUsersService } from '../../modules/users/users.service';
import { jobsSeedStep } from '../../modules/jobs/jobs.seed';
import { shippedTemplatesSeedStep } from '../../modules/templates/shipped-templates';
import { standardsSeedStep } from '../../modules/standards/standards.seed';
import { itemsSeedStep } from '../../modules/items/items.seed';
import { certificatesSeedStep } from '../../modules/certificates/certificates.seed';
import { DEMO_CUSTOMERS, DEMO_LAB, DEMO_PASSWORD, DEMO_USERS } from './demo-data';

/** What a seed step gets: `db` is the transaction the step runs in. */
export type SeedContext = { db: Db; auth: Auth; clock: () => Date; logger: Logger; config?: Config };

/**
 * One step of the demo scenario. Each step runs once per database, in its own transaction
 * together with its marker row in `seed_runs`; a step added later also runs on an existing
 * database at the next start. Steps run in list order, so a step may rely on earlier ones.
 */
export type SeedStep = { name: string; run(ctx: SeedContext): Promise<void> };

const labStep: SeedStep = {
  name: 'demo-lab',
  async run({ db, clock }) {
    await createLabRepository(db).save(DEMO_LAB, clock());
  },
};

const customersStep: SeedStep = {
  name: 'demo-customers',
  async run({ db }) {
    for (const c of DEMO_CUSTOMERS) {
      const [row] = await db.insert(customers).values({ organisation: c.organisation, address: c.address }).returning({ id: customers.id });
      await db.insert(customerContacts).values(c.contacts.map((p) => ({ ...p, customerId: row.id })));
    }
  },
};

const usersStep: SeedStep = {
  name: 'demo-users',
  async run({ db, auth, clock }) {
    const users = createUsersService({ db, usersRepo: createUsersRepository(db), customersRepo: createCustomersRepository(db), auth, clock });
    for (const u of DEMO_USERS) {
      let customerId: string | null = null;
      if (u.customerKey) {
        const org = DEMO_CUSTOMERS.find((c) => c.key === u.customerKey)!.organisation;
        const [row] = await db.select({ id: customers.id }).from(customers).where(eq(customers.organisation, org));
        customerId = row.id;
      }
      await users.create({ name: u.name, email: u.email, role: u.role, customerId, password: DEMO_PASSWORD }, db);
    }
  },
};

/** The demo scenario in order. Later features append their steps here (templates, jobs, …). */
export const SEED_STEPS: SeedStep[] = [labStep, customersStep, usersStep, standardsSeedStep, itemsSeedStep, shippedTemplatesSeedStep, jobsSeedStep, certificatesSeedStep];

/** Runs every step not yet recorded in `seed_runs`. Returns the names of the steps that ran. */
export async function runSeed(
  deps: { database: Database; auth: Auth; clock: () => Date; logger: Logger; config?: Config },
  steps: SeedStep[] = SEED_STEPS,
): Promise<string[]> {
  const ran: string[] = [];
  for (const step of steps) {
    const did = await deps.database.db.transaction(async (tx) => {
      const done = await tx.select().from(seedRuns).where(eq(seedRuns.step, step.name));
      if (done.length) return false;
      await step.run({ db: tx, auth: deps.auth, clock: deps.clock, logger: deps.logger, config: deps.config });
      await tx.insert(seedRuns).values({ step: step.name, ranAt: deps.clock() });
      return true;
    });
    if (did) ran.push(step.name);
  }
  if (ran.length) deps.logger.info('demo data seeded', { steps: ran });
  return ran;
}

export { DEMO_PASSWORD, DEMO_USERS, DEMO_LAB, DEMO_CUSTOMERS } from './demo-data';
