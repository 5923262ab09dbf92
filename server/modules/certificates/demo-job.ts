/**
 * An invented calibration job of a handheld infrared thermometer against the demo blackbody,
 * written straight into the tables with its points' results computed by the engine: the demo
 * certificate's seed step and the certificate tests use it. Every magnitude is invented; the
 * model is the shipped template "ir-thermometer-blackbody".
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { calibrationPoints, customerItems, customers, referenceStandards, templates, templateVersions, user } from '../../db/schema';
import { evaluate, ENGINE_VERSION } from '../../../shared/engine';
import { initialPointInputs, pointBudget } from '../../../shared/jobs/point-budget';
import type { PointInput } from '../../../shared/schemas/jobs.schema';
import { templateDefinitionSchema } from '../../../shared/schemas/template.schema';
import { createJobsRepository } from '../jobs/jobs.repository';

export type DemoJobOptions = {
  status: 'draft' | 'submitted' | 'approved' | 'issued';
  /** Organisation name of a demo customer (default the first). */
  organisation?: string;
  analystEmail?: string;
  /** Monte Carlo trials per point (default 20 000: enough for the §8 validation at two digits here). */
  trials?: number;
  now: Date;
};

/** Nominal temperatures (°C) and invented mean indications (°C) of the demo points. */
const POINTS = [
  { nominal: 50, indicated: [50.42, 50.38, 50.45, 50.4, 50.36, 50.44, 50.41, 50.39, 50.43, 50.4] },
  { nominal: 80, indicated: [80.55, 80.61, 80.58, 80.52, 80.6, 80.57, 80.55, 80.62, 80.58, 80.56] },
];

export async function insertDemoJob(db: Db, opts: DemoJobOptions): Promise<{ jobId: string; number: string }> {
  const [version] = await db
    .select({ id: templateVersions.id, definition: templateVersions.definition })
    .from(templateVersions)
    .innerJoin(templates, eq(templates.id, templateVersions.templateId))
    .where(and(eq(templates.key, 'ir-thermometer-blackbody'), eq(templateVersions.status, 'released')));
  if (!version) throw new Error('the shipped template ir-thermometer-blackbody must be seeded and released first');
  const def = templateDefinitionSchema.parse(version.definition);

  const [customer] = opts.organisation
    ? await db.select().from(customers).where(eq(customers.organisation, opts.organisation))
    : await db.select().from(customers).orderBy(customers.createdAt).limit(1);
  if (!customer) throw new Error('a demo customer must be seeded first');
  const [item] = await db.select().from(customerItems).where(eq(customerItems.customerId, customer.id)).orderBy(customerItems.createdAt).limit(1);
  if (!item) throw new Error(`the demo customer ${customer.organisation} has no item`);
  const [analyst] = await db.select({ id: user.id }).from(user).where(eq(user.email, opts.analystEmail ?? 'analyst@emberline-demo.test'));
  if (!analyst) throw new Error('the demo analyst must be seeded first');
  const standards = await db.select().from(referenceStandards);
  const today = opts.now.toISOString().slice(0, 10);
  const usable = (kind: string) => standards.filter((s) => s.kind === kind && s.dueDate >= today).sort((a, b) => a.name.localeCompare(b.name))[0];
  const thermometer = usable('reference_thermometer');
  const blackbody = usable('blackbody_source');
  if (!thermometer || !blackbody) throw new Error('the demo reference standards must be seeded first');

  const repo = createJobsRepository(db);
  const number = await repo.nextNumber(db, opts.now.getUTCFullYear());
  const day = (offset: number) => new Date(opts.now.getTime() + offset * 86_400_000).toISOString().slice(0, 10);
  const job = await repo.insert(db, {
    number,
    customerId: customer.id,
    itemId: item.id,
    itemLabel: [item.description, item.maker, item.model, `s/n ${item.serialNumber}`].filter(Boolean).join(', '),
    templateVersionId: version.id,
    receivedOn: day(-6),
    calibratedOn: day(-3),
    location: '',
    environment: { temperature: { value: 23.1, u: 0.25, unit: '°C' }, humidity: { value: 41, u: 2.5, unit: '%' } },
    status: opts.status,
    submittedAt: opts.status === 'draft' ? null : opts.now,
    analystId: analyst.id,
    createdAt: opts.now,
    updatedAt: opts.now,
  });

  for (const [i, p] of POINTS.entries()) {
    const tRef = p.nominal + 273.15;
    const inputs: PointInput[] = initialPointInputs(def).map((input) => {
      switch (input.symbol) {
        case 'T_ref':
          return { ...input, distribution: { type: 'normal', mean: tRef + 0.012, expanded: 0.06, k: 2 }, standardId: thermometer.id, standardNote: 'correction at 0 °C from its certificate' };
        case 'eps_bb':
          return { ...input, distribution: { type: 'normal', mean: 0.9985, expanded: 0.001, k: 2 }, standardId: blackbody.id, standardNote: 'effective emissivity (8 µm to 14 µm)' };
        case 'T_ind':
          return { ...input, distribution: { type: 'readings', values: p.indicated.map((v) => Number((v + 273.15).toFixed(2))) } };
        case 'dT_unif':
          return { ...input, distribution: { type: 'rectangular', mean: 0, halfWidth: 0.25 } };
        case 'dT_sse':
          return { ...input, distribution: { type: 'rectangular', mean: 0, halfWidth: 0.4 } };
        default:
          return input;
      }
    });
    const budget = pointBudget(def, { inputs, correlations: [] });
    if (!budget) throw new Error('demo point budget incomplete');
    const result = evaluate(budget, { trials: opts.trials ?? 20_000, seed: 20261 + i });
    const changedAt = new Date(opts.now.getTime() - 60_000);
    await db.insert(calibrationPoints).values({
      jobId: job.id,
      position: i + 1,
      nominalValue: p.nominal,
      nominalUnit: '°C',
      inputs: inputs as unknown as Array<Record<string, unknown>>,
      correlations: [],
      result: result as unknown as Record<string, unknown>,
      resultEngineVersion: ENGINE_VERSION,
      resultSeed: 20261 + i,
      computedAt: opts.now,
      changedAt,
      createdAt: changedAt,
    });
  }
  return { jobId: job.id, number };
}
