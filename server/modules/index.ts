import type { Router } from 'express';
import type { AppDeps } from '../context';
import { createCustomersRepository } from './customers/customers.repository';
import { customersRoutes } from './customers/customers.routes';
import { healthRoutes } from './health/health.routes';
import { createLabRepository } from './lab/lab.repository';
import { labRoutes } from './lab/lab.routes';
import { createLabService } from './lab/lab.service';
import { meRoutes } from './me/me.routes';
import { createTemplatesService } from './templates/templates.service';
import { templatesRoutes } from './templates/templates.routes';
import { createUsersRepository } from './users/users.repository';
import { usersRoutes } from './users/users.routes';
import { createUsersService } from './users/users.service';

/**
 * Wires repositories → services → routes and mounts each module under /api.
 * A new feature adds its factory calls and one `router.use` line here.
 */
export function registerModules(router: Router, deps: AppDeps): void {
  const { db } = deps.database;
  const labRepo = createLabRepository(db);
  const customersRepo = createCustomersRepository(db);
  const usersRepo = createUsersRepository(db);

  const lab = createLabService({ db, labRepo, clock: deps.clock });
  const users = createUsersService({ db, usersRepo, customersRepo, auth: deps.auth, clock: deps.clock });

  router.use('/health', healthRoutes(deps));
  router.use('/lab', labRoutes(lab));
  router.use('/me', meRoutes(lab));
  router.use('/users', usersRoutes(users));
  router.use('/customers', customersRoutes(customersRepo));
  router.use('/templates', templatesRoutes(createTemplatesService({ db, clock: deps.clock })));
}
