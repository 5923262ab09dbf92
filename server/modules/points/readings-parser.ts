/**
 * Reads repeated readings from typed text, a CSV file or an XLSX workbook: one column of
 * numbers, or the named column of a table. A header row is optional (a first row that is not
 * numeric is taken as the header). Every problem is reported with its row and column so the
 * analyst can fix the file; nothing is stored unless the whole column reads cleanly.
 */
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { fileTypeFromBuffer } from 'file-type';
import { AppError } from '../../errors/app-error';
import type { ApiIssue } from '../../../shared/schemas/api-error.schema';

export const MAX_READINGS_FILE_BYTES = 2 * 1024 * 1024;
export const MAX_READINGS = 100_000;

export class ReadingsError extends AppError {
  constructor(message: string, issues?: ApiIssue[]) {
    super(422, 'READINGS_INVALID', message, issues);
  }
}

/** A number as people write it in a file: "373.45", "-0.5", "1.2e-3", "373,45" (decimal comma). */
function parseCell(raw: string): number | null {
  const t = raw.trim().replace(/\u2212/g, '-');
  if (t === '') return null;
  const normalised = /^[+-]?\d+,\d+$/.test(t) ? t.replace(',', '.') : t;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(normalised)) return Number.NaN;
  return Number(normalised);
}

function columnLetter(index: number): string {
  let s = '';
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** From a grid of cell texts (rows × columns), the readings of one column. */
export function readingsFromGrid(grid: string[][], column?: string): { values: number[]; column: string; header: boolean } {
  const rows = grid.filter((r) => r.some((c) => c.trim() !== ''));
  if (rows.length === 0) throw new ReadingsError('The file has no readings: it is empty.');
  const first = rows[0];
  const header = first.some((c) => c.trim() !== '' && Number.isNaN(parseCell(c) ?? 0));
  const width = Math.max(...rows.map((r) => r.length));
  let col = 0;
  if (column !== undefined && column.trim() !== '') {
    const wanted = column.trim().toLowerCase();
    const byName = header ? first.findIndex((c) => c.trim().toLowerCase() === wanted) : -1;
    const byLetter = /^[a-z]{1,3}$/.test(wanted) ? [...wanted.toUpperCase()].reduce((a, ch) => a * 26 + ch.charCodeAt(0) - 64, 0) - 1 : -1;
    col = byName >= 0 ? byName : byLetter >= 0 && byLetter < width ? byLetter : -1;
    if (col < 0) {
      const names = header ? first.map((c) => `"${c.trim()}"`).join(', ') : 'none (the file has no header row)';
      throw new ReadingsError(`There is no column "${column}" in the file. Column names: ${names}.`);
    }
  } else if (width > 1) {
    const used = [...Array(width).keys()].filter((j) => rows.slice(header ? 1 : 0).some((r) => (r[j] ?? '').trim() !== ''));
    if (used.length > 1) {
      const names = header ? used.map((j) => `"${(first[j] ?? '').trim() || columnLetter(j)}"`).join(', ') : used.map(columnLetter).join(', ');
      throw new ReadingsError(`The file has ${used.length} columns (${names}): say which column holds the readings.`);
    }
    col = used[0] ?? 0;
  }
  const name = header ? (first[col] ?? '').trim() || columnLetter(col) : columnLetter(col);
  const body = header ? rows.slice(1) : rows;
  const issues: ApiIssue[] = [];
  const values: number[] = [];
  body.forEach((r) => {
    const raw = r[col] ?? '';
    const v = parseCell(raw);
    const rowNumber = grid.indexOf(r) + 1;
    if (v === null) return;
    if (!Number.isFinite(v)) issues.push({ path: [`row ${rowNumber}`, `column ${name}`], message: `row ${rowNumber}, column ${name}: "${raw.trim().slice(0, 40)}" is not a number` });
    else values.push(v);
  });
  if (issues.length) {
    const shown = issues.slice(0, 5).map((i) => i.message).join('; ');
    throw new ReadingsError(`${issues.length} cell${issues.length === 1 ? ' is' : 's are'} not numbers: ${shown}${issues.length > 5 ? '; …' : ''}. Nothing was saved.`, issues.slice(0, 50));
  }
  if (values.length === 0) throw new ReadingsError(`Column ${name} is empty: it holds no readings. Nothing was saved.`);
  if (values.length < 2) throw new ReadingsError(`Column ${name} holds one reading; a Type A evaluation needs at least two (GUM 4.2). Nothing was saved.`);
  if (values.length > MAX_READINGS) throw new ReadingsError(`Column ${name} holds ${values.length} readings; at most ${MAX_READINGS} are accepted.`);
  return { values, column: name, header };
}

/** Values typed or pasted: one per line, or separated by spaces, tabs or semicolons; or a pasted table. */
export function readingsFromText(text: string, column?: string): { values: number[]; column: string; header: boolean } {
  const lines = text.split(/\r?\n/);
  const tabular = lines.some((l) => l.includes('\t'));
  const grid = tabular ? lines.map((l) => l.split('\t')) : lines.flatMap((l) => l.split(/[;\s]+/).filter((t) => t !== '').map((t) => [t]));
  return readingsFromGrid(grid, column);
}

function parseCsv(text: string): string[][] {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t', '|'] });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes' || e.code === 'InvalidQuotes' || e.code === 'MissingQuotes');
  if (fatal) {
    const row = fatal.row === undefined ? '' : ` at row ${fatal.row + 1}`;
    throw new ReadingsError(`The CSV file cannot be read${row}: ${fatal.message.toLowerCase()}. Check the quotes in the file. Nothing was saved.`);
  }
  return parsed.data;
}

async function parseXlsx(buffer: Buffer): Promise<string[][]> {
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(buffer as unknown as ArrayBuffer);
  } catch {
    throw new ReadingsError('The XLSX workbook cannot be read: the file is damaged or not an Excel workbook. Nothing was saved.');
  }
  const sheet = wb.worksheets[0];
  if (!sheet) throw new ReadingsError('The workbook has no worksheet. Nothing was saved.');
  const grid: string[][] = [];
  sheet.eachRow({ includeEmpty: true }, (row, rowNumber) => {
    const cells: string[] = [];
    row.eachCell({ includeEmpty: true }, (cell, colNumber) => {
      const v = cell.value;
      let text = '';
      if (typeof v === 'number') text = String(v);
      else if (v && typeof v === 'object' && 'result' in v) text = String((v as { result: unknown }).result ?? '');
      else if (v && typeof v === 'object' && 'richText' in v) text = (v as { richText: Array<{ text: string }> }).richText.map((t) => t.text).join('');
      else if (v !== null && v !== undefined) text = String(v);
      cells[colNumber - 1] = text;
    });
    grid[rowNumber - 1] = Array.from(cells, (c) => c ?? '');
  });
  return Array.from(grid, (r) => r ?? []);
}

export type ParsedUpload = { values: number[]; column: string; header: boolean; kind: 'csv' | 'xlsx' };

/** The readings of an uploaded file, its type decided by its content (not its name). */
export async function readingsFromFile(buffer: Buffer, column?: string): Promise<ParsedUpload> {
  if (buffer.length === 0) throw new ReadingsError('The file is empty. Nothing was saved.');
  const type = await fileTypeFromBuffer(buffer);
  if (type?.ext === 'xlsx') return { ...readingsFromGrid(await parseXlsx(buffer), column), kind: 'xlsx' };
  if (type) throw new ReadingsError(`The file is a ${type.ext.toUpperCase()} file (${type.mime}); readings are accepted as CSV or XLSX. Nothing was saved.`);
  const text = buffer.toString('utf8');
  if (text.includes('\u0000') || text.includes('\uFFFD')) throw new ReadingsError('The file is not text: readings are accepted as CSV (UTF-8) or XLSX. Nothing was saved.');
  return { ...readingsFromGrid(parseCsv(text.replace(/^\uFEFF/, '')), column), kind: 'csv' };
}
