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
import { invitationsRoutes, usersRoutes } from './users/users.routes';
import { createUsersService } from './users/users.service';
import { createFileStore } from '../files/file-store';
import { createStandardsRepository } from './standards/standards.repository';
import { standardsRoutes } from './standards/standards.routes';
import { createStandardsService } from './standards/standards.service';
import { createItemsRepository } from './items/items.repository';
import { itemsRoutes } from './items/items.routes';
import { createCustomersService } from './customers/customers.service';
import { createAuditRepository } from './audit/audit.repository';
import { auditRoutes } from './audit/audit.routes';
import { calculationsRoutes, runsRoutes } from './calculations/calculations.routes';
import { createJobsRepository } from './jobs/jobs.repository';
import { jobsRoutes } from './jobs/jobs.routes';
import { createJobsService } from './jobs/jobs.service';
import { createJobSources } from './jobs/sources';
import { createPointsService } from './points/points.service';
import { pointsRoutes } from './points/points.routes';
import { createPointRuns } from '../tasks/monte-carlo-runs';
import { createCertificatesRepository } from './certificates/certificates.repository';
import { certificatesRoutes } from './certificates/certificates.routes';
import { createCertificatesService } from './certificates/certificates.service';
import { createReviewService } from './review/review.service';
import { reviewRoutes } from './review/review.routes';
import { portalRoutes } from './portal/portal.routes';
import { createVerifyService } from './verify/verify.service';
import { verifyRoutes } from './verify/verify.routes';
import { createMailAdminService } from './mail-admin/mail-admin.service';
import { mailAdminRoutes } from './mail-admin/mail-admin.routes';

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
  const users = createUsersService({
    db,
    usersRepo,
    customersRepo,
    auth: deps.auth,
    clock: deps.clock,
    outbox: deps.outbox,
    baseUrl: deps.config.baseUrl,
    labName: async (tx) => (await labRepo.get(tx)).name,
  });

  router.use('/health', healthRoutes(deps));
  router.use('/lab', labRoutes(lab));
  router.use('/me', meRoutes(lab));
  router.use('/users', usersRoutes(users));
  router.use('/invitations', invitationsRoutes(users));
  router.use('/audit', auditRoutes({ db, auditRepo: createAuditRepository(db), clock: deps.clock }));
  const customersService = createCustomersService({ db, customersRepo, itemsRepo: createItemsRepository(db), clock: deps.clock });
  router.use('/customers', customersRoutes(customersService));
  router.use('/items', itemsRoutes(customersService));
  const files = createFileStore(deps.config.dataDir);
  router.use('/standards', standardsRoutes(createStandardsService({ db, standardsRepo: createStandardsRepository(db), files, clock: deps.clock })));
  router.use('/templates', templatesRoutes(createTemplatesService({ db, clock: deps.clock })));

  const jobsRepo = createJobsRepository(db);
  const jobSources = createJobSources(db, deps.clock);
  const jobs = createJobsService({ db, jobsRepo, sources: jobSources, clock: deps.clock });
  const points = createPointsService({ db, jobsRepo, sources: jobSources, clock: deps.clock });
  // Monte Carlo runs go through the task runner (in-process pool, or the durable queue shared by instances).
  const runs = createPointRuns(deps.tasks, points.storeRunResult);
  router.use('/jobs', jobsRoutes(jobs, points, jobSources));
  router.use('/points', pointsRoutes(points, jobs, runs));
  router.use('/calculations', calculationsRoutes());
  router.use('/runs', runsRoutes(runs));

  // Review, certificates, portal, public verification, e-mail log (issue 6).
  const certificatesRepo = createCertificatesRepository(db);
  const certificates = createCertificatesService({
    db, config: deps.config, clock: deps.clock, logger: deps.logger, outbox: deps.outbox, certificatesRepo, jobs, jobsRepo, labRepo, customersRepo,
    renderPdf: (data) => deps.tasks.run('certificate-pdf', data),
  });
  router.use('/review', reviewRoutes(createReviewService({ db, auth: deps.auth, clock: deps.clock, jobs, certificates, certificatesRepo })));
  router.use('/certificates', certificatesRoutes(certificates));
  router.use('/portal', portalRoutes(certificates));
  router.use('/verify', verifyRoutes(createVerifyService({ certificatesRepo })));
  router.use('/mail', mailAdminRoutes(createMailAdminService({ db, outbox: deps.outbox, certificatesRepo, clock: deps.clock, dataDir: deps.config.dataDir, fakeSmtp: !deps.config.smtp })));
}
