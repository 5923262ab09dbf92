/**
 * The worked examples of ../shared/reference/uncertainty-cases.json (values recalled from the
 * named publications, recomputed independently — see that folder's README), converted into the
 * product's budget document format here, without editing the file.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BudgetDocument, Distribution } from '../../../shared/schemas/budget.schema';

export interface ReferenceCase {
  id: string;
  source: string;
  model: string;
  inputs: Array<{ name: string; value: number; unit: string; u: number; distribution: { type: string; params: Record<string, number> }; dof: number | null }>;
  constants?: Record<string, number>;
  expected: Record<string, unknown> & { y: number; uy: number; coverage: number; k: number; U: number };
  computed: Record<string, unknown>;
}

const FILE = join(import.meta.dirname, '../../fixtures/reference/uncertainty-cases.json');
export const referenceCases: ReferenceCase[] = JSON.parse(readFileSync(FILE, 'utf8'));

export function referenceCase(id: string): ReferenceCase {
  const c = referenceCases.find((x) => x.id === id);
  if (!c) throw new Error(`no reference case ${id}`);
  return c;
}

function distribution(d: ReferenceCase['inputs'][number]['distribution']): Distribution {
  const p = d.params;
  switch (d.type) {
    case 'normal': return { type: 'normal', mean: p.mean, sd: p.sd };
    case 'rectangular': return { type: 'rectangular', min: p.a, max: p.b };
    case 'student-t': return { type: 'student-t', mean: p.loc, scale: p.scale, dof: p.dof };
    default: throw new Error(`distribution ${d.type} not converted`);
  }
}

/** The case as a budget document: measurand `y = <model>`, the case's coverage probability. */
export function toBudget(c: ReferenceCase, extra: Partial<BudgetDocument> = {}): BudgetDocument {
  return {
    measurand: { symbol: 'y', unit: c.inputs[0].unit },
    equations: [`y = ${c.model}`],
    constants: c.constants,
    inputs: c.inputs.map((i) => ({ symbol: i.name, unit: i.unit, distribution: distribution(i.distribution), dof: i.dof })),
    coverage: c.expected.coverage,
    ...extra,
  } as BudgetDocument;
}
