import type { Db } from '../../db/client';
import { recordAudit, type AuditActor } from '../../audit';
import { ConflictError, NotFoundError, ValidationError } from '../../errors/app-error';
import type { FileStore } from '../../files/file-store';
import { requireContentType } from '../../files/upload';
import {
  DUE_SOON_DAYS,
  type CertifiedValue,
  type DueState,
  type StandardDetail,
  type StandardInputParsed,
  type StandardListQuery,
  type StandardSummary,
} from '../../../shared/schemas/standards.schema';
import { createStandardsRepository, type StandardRow, type StandardValueRow, type StandardsRepository } from './standards.repository';

/** Largest certificate PDF accepted (bytes). */
export const CERTIFICATE_MAX_BYTES = 10 * 1024 * 1024;

const DAY_MS = 86_400_000;

/** The calendar date (UTC) of an instant, as YYYY-MM-DD. */
export function isoDay(d: Date): string {
  return d.toISOString().slice(0, 10);
}

/**
 * Where a due date stands on `today`: overdue once the due date has passed (the due day itself
 * still counts as due soon), due soon within DUE_SOON_DAYS days. (Common practice, no source:
 * the laboratory's own procedure sets the warning period.)
 */
export function dueState(dueDate: string, today: string): { due: DueState; daysToDue: number } {
  const daysToDue = Math.round((Date.parse(`${dueDate}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / DAY_MS);
  return { due: daysToDue < 0 ? 'overdue' : daysToDue <= DUE_SOON_DAYS ? 'due_soon' : 'ok', daysToDue };
}

function toSummary(row: StandardRow, today: string): StandardSummary {
  return {
    id: row.id,
    name: row.name,
    kind: row.kind as StandardSummary['kind'],
    serialNumber: row.serialNumber,
    certificateNumber: row.certificateNumber,
    issuingLaboratory: row.issuingLaboratory,
    calibrationDate: row.calibrationDate,
    dueDate: row.dueDate,
    status: row.status as StandardSummary['status'],
    ...dueState(row.dueDate, today),
    hasCertificateFile: row.certificateFileSha256 !== null,
  };
}

function toValue(v: StandardValueRow): CertifiedValue {
  return {
    id: v.id,
    quantity: v.quantity,
    value: v.value,
    unit: v.unit,
    expandedUncertainty: v.expandedUncertainty,
    coverageFactor: v.coverageFactor,
    standardUncertainty: v.expandedUncertainty / v.coverageFactor,
    atValue: v.atValue,
    atUnit: v.atUnit,
  };
}

function toDetail(row: StandardRow, values: StandardValueRow[], today: string): StandardDetail {
  return {
    ...toSummary(row, today),
    notes: row.notes,
    values: values.map(toValue),
    certificateFile:
      row.certificateFileSha256 && row.certificateFileName && row.certificateFileUploadedAt
        ? { name: row.certificateFileName, size: row.certificateFileSize ?? 0, sha256: row.certificateFileSha256, uploadedAt: row.certificateFileUploadedAt.toISOString() }
        : null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** What the audit trail keeps of a standard: the record, not the flags computed from the clock. */
function auditView(d: StandardDetail | null) {
  if (!d) return null;
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { due, daysToDue, hasCertificateFile, ...rest } = d;
  return rest;
}

/** What a budget takes from a reference standard (used by the jobs feature). */
export type StandardForBudget = {
  id: string;
  name: string;
  kind: StandardSummary['kind'];
  serialNumber: string;
  certificateNumber: string;
  issuingLaboratory: string;
  calibrationDate: string;
  dueDate: string;
  status: StandardSummary['status'];
  due: DueState;
  daysToDue: number;
  /** The certificate PDF's SHA-256, when one is on file. */
  certificateFileSha256: string | null;
  values: CertifiedValue[];
};

/**
 * The certified values and due date of one reference standard, for filling a budget input
 * (value, U, k → u = U/k) and for the due-date check; null when there is no such standard.
 * Pass the caller's transaction as `db` to read inside it. `now` is the caller's clock.
 */
export async function getStandardForBudget(db: Db, id: string, now: Date): Promise<StandardForBudget | null> {
  const repo = createStandardsRepository(db);
  const row = await repo.find(id);
  if (!row) return null;
  const s = toSummary(row, isoDay(now));
  return {
    id: s.id,
    name: s.name,
    kind: s.kind,
    serialNumber: s.serialNumber,
    certificateNumber: s.certificateNumber,
    issuingLaboratory: s.issuingLaboratory,
    calibrationDate: s.calibrationDate,
    dueDate: s.dueDate,
    status: s.status,
    due: s.due,
    daysToDue: s.daysToDue,
    certificateFileSha256: row.certificateFileSha256,
    values: (await repo.values(id)).map(toValue),
  };
}

export function createStandardsService(deps: { db: Db; standardsRepo: StandardsRepository; files: FileStore; clock: () => Date }) {
  const { standardsRepo: repo } = deps;
  const today = () => isoDay(deps.clock());

  async function detail(id: string, tx: Db = deps.db): Promise<StandardDetail | null> {
    const row = await repo.find(id, tx);
    return row ? toDetail(row, await repo.values(id, tx), today()) : null;
  }

  async function ensureNameFree(name: string, exceptId: string | null, tx: Db) {
    const other = await repo.findIdByName(name, tx);
    if (other && other !== exceptId) throw new ConflictError(`A reference standard named "${name}" already exists: choose another name.`, 'NAME_TAKEN');
  }

  const fieldsOf = (input: StandardInputParsed) => ({
    name: input.name,
    kind: input.kind,
    serialNumber: input.serialNumber,
    certificateNumber: input.certificateNumber,
    issuingLaboratory: input.issuingLaboratory,
    calibrationDate: input.calibrationDate,
    dueDate: input.dueDate,
    status: input.status,
    notes: input.notes,
  });

  return {
    async list(query: StandardListQuery): Promise<{ standards: StandardSummary[]; today: string }> {
      const t = today();
      const q = query.q?.toLowerCase();
      const standards = (await repo.list())
        .map((r) => toSummary(r, t))
        .filter((s) => !query.kind || s.kind === query.kind)
        .filter((s) => !query.status || s.status === query.status)
        .filter((s) => !query.due || s.due === query.due)
        .filter((s) => !q || [s.name, s.serialNumber, s.certificateNumber, s.issuingLaboratory].some((f) => f.toLowerCase().includes(q)));
      return { standards, today: t };
    },

    async get(id: string): Promise<StandardDetail> {
      const found = await detail(id);
      if (!found) throw new NotFoundError('No reference standard has this id.');
      return found;
    },

    async create(input: StandardInputParsed, actor: AuditActor | null): Promise<StandardDetail> {
      return deps.db.transaction(async (tx) => {
        await ensureNameFree(input.name, null, tx);
        const now = deps.clock();
        const id = await repo.insert(fieldsOf(input), now, tx);
        await repo.replaceValues(id, input.values, tx);
        const after = (await detail(id, tx))!;
        await recordAudit(tx, { actor, action: 'create', entity: 'reference_standard', entityId: id, after: auditView(after), at: now });
        return after;
      });
    },

    async update(id: string, input: StandardInputParsed, actor: AuditActor | null): Promise<StandardDetail> {
      return deps.db.transaction(async (tx) => {
        if (!(await repo.findForUpdate(id, tx))) throw new NotFoundError('No reference standard has this id.');
        const before = await detail(id, tx);
        await ensureNameFree(input.name, id, tx);
        const now = deps.clock();
        await repo.update(id, fieldsOf(input), now, tx);
        await repo.replaceValues(id, input.values, tx);
        const after = (await detail(id, tx))!;
        await recordAudit(tx, { actor, action: 'update', entity: 'reference_standard', entityId: id, before: auditView(before), after: auditView(after), at: now });
        return after;
      });
    },

    /**
     * Attaches the calibration certificate PDF. The standard must exist and the bytes must be a
     * PDF by content (file-type), else nothing is stored; then the bytes go to the file store
     * under their SHA-256 and the record points at them, audited in one transaction.
     */
    async uploadCertificate(id: string, file: { buffer: Buffer; originalname: string }, actor: AuditActor | null): Promise<StandardDetail> {
      if (!(await repo.find(id))) throw new NotFoundError('No reference standard has this id.');
      if (file.buffer.length === 0) throw new ValidationError([{ path: ['body', 'file'], message: 'The file is empty.' }], 'The file is empty. Nothing was stored.');
      await requireContentType(file.buffer, ['application/pdf'], 'certificate', 'a PDF file (application/pdf)');
      const name = safeFileName(file.originalname, 'certificate.pdf');
      return deps.db.transaction(async (tx) => {
        const row = await repo.findForUpdate(id, tx);
        if (!row) throw new NotFoundError('No reference standard has this id.');
        const before = toDetail(row, [], today()).certificateFile;
        const stored = deps.files.put(file.buffer);
        const now = deps.clock();
        await repo.setCertificateFile(id, { sha256: stored.sha256, name, size: stored.size }, now, tx);
        const after = (await detail(id, tx))!;
        await recordAudit(tx, { actor, action: 'upload_file', entity: 'reference_standard', entityId: id, before: { certificateFile: before }, after: { certificateFile: after.certificateFile }, at: now });
        return after;
      });
    },

    /** The stored certificate PDF, checked against its recorded SHA-256. */
    async certificateFile(id: string): Promise<{ bytes: Buffer; name: string }> {
      const row = await repo.find(id);
      if (!row) throw new NotFoundError('No reference standard has this id.');
      if (!row.certificateFileSha256) throw new NotFoundError('No certificate file has been uploaded for this standard.');
      const bytes = deps.files.readVerified(row.certificateFileSha256);
      if (!bytes) throw new ConflictError('The stored certificate file is missing or does not match its recorded SHA-256; restore it from a backup.', 'FILE_INTEGRITY');
      return { bytes, name: row.certificateFileName ?? 'certificate.pdf' };
    },

    getStandardForBudget(id: string, tx: Db = deps.db) {
      return getStandardForBudget(tx, id, deps.clock());
    },
  };
}
export type StandardsService = ReturnType<typeof createStandardsService>;

/** A file name safe to keep and to send back: no path, no control characters, bounded length. */
export function safeFileName(name: string | undefined, fallback: string): string {
  const base = (name ?? '').split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 150);
  return cleaned || fallback;
}
