/**
 * Demo jobs (invented): a draft with one point still to fill, and one submitted for review with
 * a complete budget and a stored Monte Carlo result. Runs after the templates, items and
 * reference standards steps. The certificate workflow adds the issued job.
 */
import { eq } from 'drizzle-orm';
import type { SeedStep } from '../../db/seed';
import { user } from '../../db/schema';
import { evaluate } from '../../../shared/engine';
import { createPointsService } from '../points/points.service';
import { createJobsRepository } from './jobs.repository';
import { createJobsService } from './jobs.service';
import { createJobSources } from './sources';

const READINGS_80C = [80.9, 79.2, 81.6, 80.1, 78.9, 81.8, 80.4, 79.5, 81.2, 80.0];
const READINGS_150C = [151.4, 148.6, 152.2, 150.3, 148.1, 152.6, 150.5, 148.9, 151.9, 149.8];

export const jobsSeedStep: SeedStep = {
  name: 'demo-jobs',
  async run({ db, clock }) {
    const [analyst] = await db.select().from(user).where(eq(user.email, 'analyst@emberline-demo.test'));
    if (!analyst) return;
    const actor = { id: analyst.id, name: analyst.name, role: 'analyst' as const };
    const sources = createJobSources(db, clock);
    const jobsRepo = createJobsRepository(db);
    const jobs = createJobsService({ db, jobsRepo, sources, clock });
    const points = createPointsService({ db, jobsRepo, sources, clock });
    const version = (await sources.listReleasedTemplateVersions()).find((v) => v.key === 'ir-thermometer-blackbody');
    const items = await sources.listItems();
    const standards = await sources.listStandards();
    const thermometer = standards.find((s) => s.kind === 'reference_thermometer' && (!s.dueDate || s.dueDate >= clock().toISOString().slice(0, 10)));
    const blackbody = standards.find((s) => s.kind === 'blackbody_source' && s.values.some((v) => /emissivity/i.test(v.label)) && (!s.dueDate || s.dueDate >= clock().toISOString().slice(0, 10)));
    const handhelds = items.filter((i) => /infrared thermometer/i.test(i.description));
    if (!version || handhelds.length < 2 || !thermometer || !blackbody) return;
    const day = (offset: number) => new Date(clock().getTime() + offset * 86_400_000).toISOString().slice(0, 10);
    const emissivityIndex = blackbody.values.findIndex((v) => /emissivity/i.test(v.label));

    async function filled(jobId: string, nominal: number, readings: number[]) {
      const p = await points.add(jobId, { nominalValue: nominal }, actor);
      await points.setReadings(p.id, 'T_ind', readings, '°C', { fileName: null, sha256: null, column: null }, actor);
      await points.fromStandard(p.id, 'T_ref', { standardId: thermometer!.id }, actor);
      await points.fromStandard(p.id, 'eps_bb', { standardId: blackbody!.id, valueIndex: emissivityIndex }, actor);
      return p.id;
    }

    // Submitted: two complete points with Monte Carlo results (10^5 trials, fixed seeds).
    const submitted = await jobs.create({ customerId: handhelds[0].customerId, itemId: handhelds[0].id, templateVersionId: version.id, receivedOn: day(-6), calibratedOn: day(-2), location: 'Laboratory room 2', environment: { temperature: { value: 23.0, u: 0.3, unit: '°C' }, humidity: { value: 42, u: 3, unit: '%' } } }, actor);
    let seed = 20261;
    for (const [nominal, r] of [[80, READINGS_80C], [150, READINGS_150C]] as const) {
      const id = await filled(submitted.id, nominal, [...r]);
      const { doc, readAt } = await points.budgetForRun(id, actor);
      const result = evaluate(doc, { trials: 100_000, seed: seed++ });
      await points.storeRunResult(id, result, readAt, actor);
    }
    await jobs.submit(submitted.id, actor);

    // Draft: one point whose readings are still to come.
    const draft = await jobs.create({ customerId: handhelds[1].customerId, itemId: handhelds[1].id, templateVersionId: version.id, receivedOn: day(-1), location: 'Laboratory room 2', environment: { temperature: { value: 22.8, u: 0.3, unit: '°C' } } }, actor);
    const p = await points.add(draft.id, { nominalValue: 80 }, actor);
    await points.fromStandard(p.id, 'T_ref', { standardId: thermometer.id }, actor);
  },
};
