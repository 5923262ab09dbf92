import { asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { referenceStandards, referenceStandardValues } from '../../db/schema';
import type { CertifiedValueInput, StandardKind, StandardStatus } from '../../../shared/schemas/standards.schema';

export type StandardRow = typeof referenceStandards.$inferSelect;
export type StandardValueRow = typeof referenceStandardValues.$inferSelect;

export type StandardFields = {
  name: string;
  kind: StandardKind;
  serialNumber: string;
  certificateNumber: string;
  issuingLaboratory: string;
  calibrationDate: string;
  dueDate: string;
  status: StandardStatus;
  notes: string;
};

export function createStandardsRepository(db: Db) {
  return {
    async list(tx: Db = db): Promise<StandardRow[]> {
      return tx.select().from(referenceStandards).orderBy(asc(referenceStandards.dueDate), asc(referenceStandards.name));
    },
    async find(id: string, tx: Db = db): Promise<StandardRow | null> {
      const [row] = await tx.select().from(referenceStandards).where(eq(referenceStandards.id, id));
      return row ?? null;
    },
    /** Locks the row for the rest of the transaction (concurrent edits queue). */
    async findForUpdate(id: string, tx: Db): Promise<StandardRow | null> {
      const [row] = await tx.select().from(referenceStandards).where(eq(referenceStandards.id, id)).for('update');
      return row ?? null;
    },
    async findIdByName(name: string, tx: Db = db): Promise<string | null> {
      const [row] = await tx
        .select({ id: referenceStandards.id })
        .from(referenceStandards)
        .where(sql`lower(${referenceStandards.name}) = lower(${name})`);
      return row?.id ?? null;
    },
    async values(standardId: string, tx: Db = db): Promise<StandardValueRow[]> {
      return tx.select().from(referenceStandardValues).where(eq(referenceStandardValues.standardId, standardId)).orderBy(asc(referenceStandardValues.position));
    },
    async insert(fields: StandardFields, now: Date, tx: Db = db): Promise<string> {
      const [row] = await tx
        .insert(referenceStandards)
        .values({ ...fields, createdAt: now, updatedAt: now })
        .returning({ id: referenceStandards.id });
      return row.id;
    },
    async update(id: string, fields: StandardFields, now: Date, tx: Db = db): Promise<void> {
      await tx
        .update(referenceStandards)
        .set({ ...fields, updatedAt: now })
        .where(eq(referenceStandards.id, id));
    },
    /**
     * Makes the stored values equal to `values`, in order: rows whose id is given are updated in
     * place (so a value keeps its id across edits), rows not named any more are removed, the
     * rest are added.
     */
    async replaceValues(standardId: string, values: CertifiedValueInput[], tx: Db = db): Promise<void> {
      const existing = await this.values(standardId, tx);
      const keep = new Set(values.map((v) => v.id).filter((id): id is string => !!id && existing.some((e) => e.id === id)));
      const gone = existing.filter((e) => !keep.has(e.id)).map((e) => e.id);
      if (gone.length) await tx.delete(referenceStandardValues).where(inArray(referenceStandardValues.id, gone));
      for (const [position, v] of values.entries()) {
        const fields = {
          position,
          quantity: v.quantity,
          value: v.value,
          unit: v.unit,
          expandedUncertainty: v.expandedUncertainty,
          coverageFactor: v.coverageFactor,
          atValue: v.atValue ?? null,
          atUnit: v.atValue == null ? null : (v.atUnit ?? null),
        };
        if (v.id && keep.has(v.id)) await tx.update(referenceStandardValues).set(fields).where(eq(referenceStandardValues.id, v.id));
        else await tx.insert(referenceStandardValues).values({ ...fields, standardId });
      }
    },
    async setCertificateFile(id: string, file: { sha256: string; name: string; size: number }, now: Date, tx: Db = db): Promise<void> {
      await tx
        .update(referenceStandards)
        .set({ certificateFileSha256: file.sha256, certificateFileName: file.name, certificateFileSize: file.size, certificateFileUploadedAt: now, updatedAt: now })
        .where(eq(referenceStandards.id, id));
    },
  };
}
export type StandardsRepository = ReturnType<typeof createStandardsRepository>;
