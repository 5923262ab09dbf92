/**
 * Demo seed step (after the jobs module's 'demo-jobs', which leaves a draft and a job submitted
 * for review): one issued job with its signed certificate in the first demo customer's portal and
 * mailbox. The job is the invented one of ./demo-job.ts. The certificate is issued exactly as an
 * approval issues it (same assembly, signature and e-mail), rendered in-process because the seed
 * runs inside one transaction.
 */
import { eq } from 'drizzle-orm';
import type { SeedStep } from '../../db/seed';
import { user } from '../../db/schema';
import { createOutbox } from '../../mail/outbox';
import { renderCertificatePdf } from '../../pdf/render-certificate';
import type { Role } from '../../../shared/schemas/roles';
import { createCustomersRepository } from '../customers/customers.repository';
import { createJobsRepository } from '../jobs/jobs.repository';
import { createJobsService } from '../jobs/jobs.service';
import { createJobSources } from '../jobs/sources';
import { createLabRepository } from '../lab/lab.repository';
import { createCertificatesRepository } from './certificates.repository';
import { createCertificatesService } from './certificates.service';
import { insertDemoJob } from './demo-job';

export const certificatesSeedStep: SeedStep = {
  name: 'demo-certificate',
  async run({ db, clock, logger, config }) {
    if (!config) throw new Error('the demo certificate step needs the configuration (signing identity under DATA_DIR)');
    // API tests (NODE_ENV=test) build the jobs they need themselves; demo jobs and queued mail
    // there would change other tests' counts. Browser tests run the built server and get them.
    if (config.nodeEnv === 'test') return;
    const now = clock();
    const [signatory] = await db.select({ id: user.id, name: user.name, role: user.role }).from(user).where(eq(user.email, 'signatory@emberline-demo.test'));
    if (!signatory) throw new Error('the demo signatory must be seeded first');

    const jobsRepo = createJobsRepository(db);
    const jobs = createJobsService({ db, jobsRepo, sources: createJobSources(db, clock), clock });
    // The outbox loop of the running server sends what this step queues; this instance only writes rows.
    const outbox = createOutbox({
      db,
      mailer: { from: '', send: () => Promise.reject(new Error('the seed does not send mail')), close: () => {} },
      clock,
      logger,
      dataDir: config.dataDir,
      messageIdDomain: new URL(config.baseUrl).hostname || 'emberline.invalid',
    });
    const certificates = createCertificatesService({
      db,
      config,
      clock,
      logger,
      outbox,
      certificatesRepo: createCertificatesRepository(db),
      jobs,
      jobsRepo,
      labRepo: createLabRepository(db),
      customersRepo: createCustomersRepository(db),
      renderPdf: renderCertificatePdf,
    });

    const issued = await insertDemoJob(db, { status: 'submitted', now: new Date(now.getTime() - 2 * 86_400_000) });
    const review = await jobs.getJobForReview(issued.jobId);
    await certificates.issue(review, { id: signatory.id, name: signatory.name, role: signatory.role as Role });
  },
};
