import type { EvaluationResult } from '../../../../shared/engine';
import type { JobDto, JobView, PointInput } from '../../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../../shared/schemas/template.schema';

/** The job contracts live in shared/schemas/jobs.schema.ts (one zod schema each). */
export type { JobAmends, JobListRow } from '../../../../shared/schemas/jobs.schema';
export type Job = JobDto;
export type Reported = { method: 'gum' | 'monte-carlo'; y: number; U: number; k: number | null; interval: [number, number]; note: string | null };
export type Point = {
  id: string; jobId: string; position: number; nominalValue: number; nominalUnit: string; inputs: PointInput[];
  correlations: Array<{ between: [string, string]; r: number }>; outsideScope: boolean; outsideScopeReason: string | null;
  result: EvaluationResult | null; resultEngineVersion: string | null; resultSeed: number | null; computedAt: string | null; changedAt: string; current: boolean; reported: Reported | null;
};
export type Standard = { id: string; name: string; identifier: string | null; kind: string | null; certificateNumber: string | null; dueDate: string | null; status: string; values: Array<{ label: string; value: number; U: number; k: number; unit: string }> };
export type JobDetail = {
  job: JobView;
  template: { id: string; name: string; version: number; key: string | null; definition: TemplateDefinition };
  points: Point[];
  readings: Array<{ pointId: string; symbol: string; n: number; fileName: string | null; sha256: string | null; column: string | null; uploadedAt: string }>;
  standards: Standard[];
};
export type Reason = { code: string; message: string; pointId: string | null; pointPosition: number | null; symbol: string | null };
export type Checks = { reasons: Reason[]; notes: Reason[]; cmc: Record<string, { U: number; basisValue: number; basis: string; row: number } | null> };
export type JobOptions = {
  templateVersions: Array<{ id: string; name: string; version: number; key: string | null; measurand: { symbol: string; unit?: string; description: string } }>;
  items: Array<{ id: string; customerId: string; description: string; maker: string | null; model: string | null; serial: string | null }>;
};
