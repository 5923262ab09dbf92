/**
 * A point's or a job's uncertainty budget as CSV (papaparse) or XLSX (exceljs). Text cells that
 * a spreadsheet would read as a formula (starting with = + - @, or a tab or carriage return)
 * get a leading apostrophe (OWASP, "CSV Injection"); numbers stay numbers.
 */
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import type { EvaluationResult } from '../../../shared/engine';
import type { PointInput } from '../../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../../shared/schemas/template.schema';

export type ExportPoint = {
  label: string;
  point: { inputs: PointInput[]; result: EvaluationResult | null; reported: { method: string; y: number; U: number; k: number | null; interval: [number, number]; note: string | null } | null; resultSeed: number | null; resultEngineVersion: string | null; computedAt: string | null };
};

export function neutralise(cell: unknown): unknown {
  if (typeof cell !== 'string') return cell;
  return /^[=+\-@\t\r]/.test(cell) ? `'${cell}` : cell;
}

const HEADER = ['point', 'symbol', 'meaning', 'unit', 'estimate', 'standard uncertainty', 'distribution', 'sensitivity coefficient', 'contribution', 'degrees of freedom', 'share'];

function rows(title: string, def: TemplateDefinition, list: ExportPoint[]): unknown[][] {
  const out: unknown[][] = [[`Uncertainty budget: ${title}`], [`Model: ${def.name}`], [`Measurand: ${def.measurand.symbol} (${def.measurand.description}) in ${def.measurand.unit ?? ''}`], [], HEADER];
  for (const { label, point } of list) {
    const r = point.result;
    if (!r) {
      out.push([label, '', 'no result yet']);
      continue;
    }
    for (const b of r.gum.budget) {
      const input = point.inputs.find((i) => i.symbol === b.symbol);
      out.push([label, b.symbol, input?.description ?? '', input?.unit ?? '', b.estimate, b.u, b.distribution, b.c, b.contribution, b.dof === 'infinite' ? 'infinite' : b.dof, b.share]);
    }
    out.push([label, r.measurand, 'combined standard uncertainty u(y)', r.unit, r.gum.y, r.gum.u, '', '', '', r.gum.nuEff === null ? 'not applicable' : r.gum.nuEff, 1]);
    out.push([label, 'k', 'coverage factor', '', r.gum.k]);
    out.push([label, 'U', 'expanded uncertainty (GUM)', r.unit, r.gum.U]);
    if (r.mcm) out.push([label, 'MCM', `Monte Carlo: ${r.mcm.trials} trials, seed ${r.mcm.seed}, ${r.mcm.intervalKind} interval`, r.unit, r.mcm.y, r.mcm.u, '', '', `${r.mcm.interval[0]} to ${r.mcm.interval[1]}`]);
    if (r.validation) out.push([label, 'validation', `GUM against Monte Carlo (JCGM 101 §8): ${r.validation.passed ? 'passed' : 'failed'}`, r.unit, r.validation.delta, '', '', '', `d_low ${r.validation.dLow}, d_high ${r.validation.dHigh}`]);
    if (point.reported) out.push([label, 'reported', `${point.reported.method === 'monte-carlo' ? 'Monte Carlo' : 'GUM'} result reported${point.reported.note ? ': ' + point.reported.note : ''}`, r.unit, point.reported.y, '', '', '', point.reported.U]);
    out.push([label, 'engine', `${point.resultEngineVersion ?? r.engineVersion}; computed ${point.computedAt ?? ''}`]);
    out.push([]);
  }
  return out;
}

export function budgetCsv(title: string, def: TemplateDefinition, list: ExportPoint[]): string {
  return '\uFEFF' + Papa.unparse(rows(title, def, list).map((r) => r.map(neutralise)), { newline: '\r\n' });
}

export async function budgetXlsx(title: string, def: TemplateDefinition, list: ExportPoint[]): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Emberline';
  const ws = wb.addWorksheet('Budget');
  for (const r of rows(title, def, list)) ws.addRow(r.map(neutralise));
  ws.getRow(5).font = { bold: true };
  ws.columns.forEach((c, i) => (c.width = i === 2 ? 48 : 16));
  const buf = await wb.xlsx.writeBuffer();
  return Buffer.from(buf as ArrayBuffer);
}
