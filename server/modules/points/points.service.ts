/**
 * Calibration points of a draft job: add, change and remove; readings (typed, pasted or
 * uploaded) that become a Type A input; inputs taken from a reference standard's certificate;
 * the GUM calculation and the stored Monte Carlo result. A change to anything the result
 * depends on moves `changedAt`, so an older result is no longer current.
 */
import crypto from 'node:crypto';
import { recordAudit } from '../../audit';
import { auditActor } from '../../audit/actor';
import type { Db } from '../../db/client';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../../errors/app-error';
import { evaluateGum, typeA, ENGINE_VERSION, type EvaluationResult } from '../../../shared/engine';
import { convert, convertInterval, formatUnit } from '../../../shared/format/units';
import { initialPointInputs, pointBudget } from '../../../shared/jobs/point-budget';
import type { PointInput, UpdatePoint } from '../../../shared/schemas/jobs.schema';
import type { JobsRepository, PointRow } from '../jobs/jobs.repository';
import { JobNotDraftError, toPointDto, type Actor } from '../jobs/jobs.service';
import type { JobSources } from '../jobs/sources';

export type ReadingsMeta = { fileName: string | null; sha256: string | null; column: string | null };

/** Converts values in `from` (a display unit) to the input's SI unit; the same unit passes. */
function toSi(values: number[], from: string | undefined, si: string | undefined): number[] {
  if (!from || !si || formatUnit(from) === formatUnit(si)) return values;
  try {
    return values.map((v) => convert(v, from, si));
  } catch (err) {
    throw new ValidationError([{ path: ['unit'], message: (err as Error).message }], `The readings’ unit ${from} cannot be converted to ${si}.`);
  }
}

/** The certified value stated nearest the point's nominal value (the first when none says where it applies). */
function nearestValue(values: Array<{ at?: { value: number; unit: string } | null }>, nominal: number | undefined, unit: string | undefined): number {
  if (nominal === undefined || !unit) return 0;
  let best = 0;
  let bestDist = Infinity;
  values.forEach((v, i) => {
    if (!v.at) return;
    let at: number;
    try {
      at = convert(v.at.value, v.at.unit, unit);
    } catch {
      return;
    }
    if (Math.abs(at - nominal) < bestDist) {
      bestDist = Math.abs(at - nominal);
      best = i;
    }
  });
  return best;
}

export function createPointsService(deps: { db: Db; jobsRepo: JobsRepository; sources: JobSources; clock: () => Date }) {
  const { db, jobsRepo, sources, clock } = deps;

  async function lockDraftJob(tx: Db, jobId: string, actor: Actor) {
    const job = await jobsRepo.lockJob(tx, jobId);
    if (!job) throw new NotFoundError('There is no such job.');
    if (job.analystId !== actor.id) throw new ForbiddenError('Only the analyst who opened this job can change it.');
    if (job.status !== 'draft') throw new JobNotDraftError(job.status);
    return job;
  }

  async function lockPoint(tx: Db, pointId: string, actor: Actor) {
    const p = await jobsRepo.point(pointId, tx);
    if (!p) throw new NotFoundError('There is no such calibration point.');
    const job = await lockDraftJob(tx, p.jobId, actor);
    return { point: p, job };
  }

  function inputOf(p: PointRow, symbol: string): { inputs: PointInput[]; index: number } {
    const inputs = p.inputs as PointInput[];
    const index = inputs.findIndex((i) => i.symbol === symbol);
    if (index < 0) throw new NotFoundError(`The point has no input ${symbol}.`);
    return { inputs, index };
  }

  async function definitionOf(templateVersionId: string, tx: Db = db) {
    const v = await sources.getTemplateVersion(templateVersionId, tx);
    if (!v) throw new NotFoundError('The measurement model of this job is no longer available.');
    return v.definition;
  }

  async function audit(tx: Db, actor: Actor, action: string, entityId: string, before: unknown, after: unknown, entity = 'calibration_point') {
    await recordAudit(tx, { actor: auditActor(actor), action, entity, entityId, before, after, at: clock() });
  }

  return {
    async add(jobId: string, body: { nominalValue: number; nominalUnit?: string }, actor: Actor) {
      return db.transaction(async (tx) => {
        const job = await lockDraftJob(tx, jobId, actor);
        const def = await definitionOf(job.templateVersionId, tx);
        const existing = await jobsRepo.points(jobId, tx);
        const now = clock();
        const basis = def.cmc?.basis ? def.inputs.find((i) => i.symbol === def.cmc!.basis) : undefined;
        const unit = body.nominalUnit ?? basis?.displayUnit ?? basis?.unit ?? def.measurand.unit ?? '';
        const row = await jobsRepo.insertPoint(tx, {
          jobId,
          position: existing.reduce((m, p) => Math.max(m, p.position), 0) + 1,
          nominalValue: body.nominalValue,
          nominalUnit: unit,
          inputs: initialPointInputs(def),
          correlations: (def.correlations ?? []).filter((c) => c.r !== 0),
          changedAt: now,
          createdAt: now,
        });
        await audit(tx, actor, 'create', row.id, null, { jobId, position: row.position, nominalValue: row.nominalValue, nominalUnit: row.nominalUnit });
        return toPointDto(row);
      });
    },

    async get(pointId: string) {
      const p = await jobsRepo.point(pointId);
      if (!p) throw new NotFoundError('There is no such calibration point.');
      const readings = await jobsRepo.readings(pointId);
      return { point: toPointDto(p), readings: readings.map((r) => ({ symbol: r.symbol, values: r.values, fileName: r.fileName, sha256: r.sha256, column: r.column, uploadedAt: r.uploadedAt.toISOString() })) };
    },

    async update(pointId: string, patch: UpdatePoint, actor: Actor) {
      return db.transaction(async (tx) => {
        const { point } = await lockPoint(tx, pointId, actor);
        const current = point.inputs as PointInput[];
        if (patch.inputs) {
          const want = current.map((i) => i.symbol).join(',');
          const got = patch.inputs.map((i) => i.symbol).join(',');
          if (want !== got) throw new ValidationError([{ path: ['body', 'inputs'], message: `the inputs must be the model's, in its order: ${want}` }]);
        }
        // Workflow fields stay as the model and the register set them.
        const inputs = patch.inputs?.map((i, k) => ({ ...i, unit: current[k].unit, source: current[k].source, referenceKind: current[k].referenceKind, description: current[k].description }));
        const budgetChanged = Boolean(patch.inputs || patch.correlations);
        const now = clock();
        const row = await jobsRepo.updatePoint(tx, pointId, {
          ...(patch.nominalValue !== undefined ? { nominalValue: patch.nominalValue } : {}),
          ...(patch.nominalUnit !== undefined ? { nominalUnit: patch.nominalUnit } : {}),
          ...(inputs ? { inputs } : {}),
          ...(patch.correlations ? { correlations: patch.correlations } : {}),
          ...(patch.outsideScope !== undefined ? { outsideScope: patch.outsideScope, outsideScopeReason: patch.outsideScope ? (patch.outsideScopeReason ?? null) : null } : {}),
          ...(budgetChanged ? { changedAt: now } : {}),
        });
        await audit(tx, actor, 'update', pointId, toPointDto(point), toPointDto(row));
        return toPointDto(row);
      });
    },

    async remove(pointId: string, actor: Actor) {
      await db.transaction(async (tx) => {
        const { point } = await lockPoint(tx, pointId, actor);
        await jobsRepo.deletePoint(tx, pointId);
        await audit(tx, actor, 'delete', pointId, toPointDto(point), null);
      });
    },

    /** Readings for a Type A input; the reply gives n, mean, s, s/√n and ν in the readings' unit. */
    async setReadings(pointId: string, symbol: string, values: number[], unit: string | undefined, meta: ReadingsMeta, actor: Actor) {
      return db.transaction(async (tx) => {
        const { point } = await lockPoint(tx, pointId, actor);
        const { inputs, index } = inputOf(point, symbol);
        const input = inputs[index];
        const shownUnit = unit ?? input.displayUnit ?? input.unit;
        const si = toSi(values, shownUnit, input.unit);
        const stats = typeA(values);
        const now = clock();
        const next = inputs.map((i, k) => (k === index ? { ...i, distribution: { type: 'readings' as const, values: si } } : i));
        const row = await jobsRepo.updatePoint(tx, pointId, { inputs: next, changedAt: now });
        await jobsRepo.upsertReadings(tx, { pointId, symbol, values: si, fileName: meta.fileName, sha256: meta.sha256, column: meta.column, uploadedBy: actor.id, uploadedAt: now });
        await audit(tx, actor, meta.fileName ? 'upload_readings' : 'set_readings', pointId, { symbol, distribution: input.distribution }, { symbol, n: values.length, fileName: meta.fileName, sha256: meta.sha256, column: meta.column }, 'calibration_point');
        return { point: toPointDto(row), typeA: { ...stats, unit: shownUnit ?? '' }, fileName: meta.fileName, sha256: meta.sha256, column: meta.column };
      });
    },

    /** An input from a reference standard's certificate: U and k → u = U/k, as a normal distribution. */
    async fromStandard(pointId: string, symbol: string, body: { standardId: string; valueIndex?: number }, actor: Actor) {
      const standard = await sources.getStandard(body.standardId);
      if (!standard) throw new ValidationError([{ path: ['body', 'standardId'], message: 'there is no such reference standard in the register' }]);
      const pre = await jobsRepo.point(pointId);
      const v = standard.values[body.valueIndex ?? nearestValue(standard.values, pre?.nominalValue, pre?.nominalUnit)];
      if (!v) throw new ValidationError([{ path: ['body', 'valueIndex'], message: `${standard.name} has ${standard.values.length} certified value(s)` }]);
      return db.transaction(async (tx) => {
        const { point } = await lockPoint(tx, pointId, actor);
        const { inputs, index } = inputOf(point, symbol);
        const input = inputs[index];
        const dimensionless = (u: string | undefined) => !u || u.trim() === '' || u.trim() === '1';
        const sameUnit = (dimensionless(input.unit) && dimensionless(v.unit)) || formatUnit(input.unit ?? '') === formatUnit(v.unit ?? '');
        // A certified correction (or offset) gives the uncertainty of the standard's reading, not
        // the reading itself: the estimate stays the one entered (or the point's nominal value).
        const correction = /correction|offset/i.test(v.label);
        let mean = v.value;
        let U = v.U;
        if (!sameUnit) {
          try {
            mean = convert(v.value, v.unit, input.unit ?? '');
            U = convertInterval(v.U, v.unit, input.unit ?? '');
          } catch {
            throw new ValidationError([{ path: ['body', 'valueIndex'], message: `the certified value is in ${v.unit || 'no unit'}, the input in ${input.unit}` }], `The certified value of ${standard.name} is in ${v.unit || 'no unit'}; ${symbol} needs ${input.unit}.`);
          }
        }
        if (correction) {
          const d = input.distribution;
          const current = d && 'mean' in d ? (d as { mean: number }).mean : null;
          let nominal: number | null;
          try {
            nominal = convert(point.nominalValue, point.nominalUnit, input.unit ?? '');
          } catch {
            nominal = null;
          }
          mean = current ?? nominal ?? 0;
        }
        const now = clock();
        const next = inputs.map((i, k) =>
          k === index ? { ...i, distribution: { type: 'normal' as const, mean, expanded: U, k: v.k }, standardId: standard.id, standardNote: `${standard.name}${standard.certificateNumber ? `, certificate ${standard.certificateNumber}` : ''}: ${v.label}${correction ? ' (U and k of the correction; the value is the reading)' : ''}` } : i,
        );
        const row = await jobsRepo.updatePoint(tx, pointId, { inputs: next, changedAt: now });
        await audit(tx, actor, 'take_from_standard', pointId, { symbol, distribution: input.distribution, standardId: input.standardId ?? null }, { symbol, standardId: standard.id, value: mean, U, k: v.k });
        return { point: toPointDto(row), standard, u: U / v.k };
      });
    },

    /** The GUM result of the saved budget, stored on the point (Monte Carlo comes from a run). */
    async calculate(pointId: string, actor: Actor) {
      return db.transaction(async (tx) => {
        const { point, job } = await lockPoint(tx, pointId, actor);
        const def = await definitionOf(job.templateVersionId, tx);
        const doc = pointBudget(def, { inputs: point.inputs as PointInput[], correlations: point.correlations });
        if (!doc) {
          const missing = (point.inputs as PointInput[]).filter((i) => i.distribution === null).map((i) => i.symbol);
          throw new ConflictError(`Fill every input before calculating: ${missing.join(', ')} ${missing.length === 1 ? 'has' : 'have'} no value yet.`, 'INPUTS_MISSING');
        }
        const result = evaluateGum(doc);
        const now = clock();
        const row = await jobsRepo.updatePoint(tx, pointId, { result: result as unknown as Record<string, unknown>, resultEngineVersion: ENGINE_VERSION, resultSeed: null, computedAt: now });
        await audit(tx, actor, 'calculate', pointId, null, { y: result.gum.y, U: result.gum.U, engineVersion: ENGINE_VERSION });
        return toPointDto(row);
      });
    },

    /** The budget document of a point for a Monte Carlo run, with the time it was read. */
    async budgetForRun(pointId: string, actor: Actor) {
      const p = await jobsRepo.point(pointId);
      if (!p) throw new NotFoundError('There is no such calibration point.');
      const job = await jobsRepo.get(p.jobId);
      if (!job) throw new NotFoundError('There is no such job.');
      if (job.analystId !== actor.id) throw new ForbiddenError('Only the analyst who opened this job can run its calculations.');
      if (job.status !== 'draft') throw new JobNotDraftError(job.status);
      const def = await definitionOf(job.templateVersionId);
      const doc = pointBudget(def, { inputs: p.inputs as PointInput[], correlations: p.correlations });
      if (!doc) throw new ConflictError('Fill every input before running Monte Carlo.', 'INPUTS_MISSING');
      return { doc, readAt: clock(), trials: def.monteCarlo?.trials };
    },

    /**
     * Stores a Monte Carlo result. `computedAt` is when the budget was read for the run: a
     * change made while it ran leaves the point with a result that is not current.
     */
    async storeRunResult(pointId: string, result: EvaluationResult, readAt: Date, actor: Actor) {
      await db.transaction(async (tx) => {
        const p = await jobsRepo.point(pointId, tx);
        if (!p) return;
        const job = await jobsRepo.lockJob(tx, p.jobId);
        if (!job || job.status !== 'draft') return;
        await jobsRepo.updatePoint(tx, pointId, { result: result as unknown as Record<string, unknown>, resultEngineVersion: result.engineVersion, resultSeed: result.mcm?.seed ?? null, computedAt: readAt });
        await audit(tx, actor, 'monte_carlo', pointId, null, { trials: result.mcm?.trials, seed: result.mcm?.seed, engineVersion: result.engineVersion, y: result.mcm?.y, interval: result.mcm?.interval });
      });
    },

    sha256: (buf: Buffer) => crypto.createHash('sha256').update(buf).digest('hex'),
  };
}

export type PointsService = ReturnType<typeof createPointsService>;
