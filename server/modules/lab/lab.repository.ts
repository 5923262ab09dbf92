import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { labSettings } from '../../db/schema';
import type { LabSettings, LabSettingsInput } from '../../../shared/schemas/lab.schema';

const EMPTY: LabSettings = { name: 'Calibration laboratory', address: '', accreditationNumber: '', contactEmail: '', contactPhone: '' };

export function createLabRepository(db: Db) {
  return {
    /** The settings row, or neutral defaults before anyone saved one. */
    async get(tx: Db = db): Promise<LabSettings> {
      const [row] = await tx.select().from(labSettings).where(eq(labSettings.id, 1));
      if (!row) return EMPTY;
      return {
        name: row.name,
        address: row.address,
        accreditationNumber: row.accreditationNumber,
        contactEmail: row.contactEmail,
        contactPhone: row.contactPhone,
      };
    },
    async save(input: LabSettingsInput, now: Date, tx: Db = db): Promise<void> {
      await tx
        .insert(labSettings)
        .values({ id: 1, ...input, updatedAt: now })
        .onConflictDoUpdate({ target: labSettings.id, set: { ...input, updatedAt: now } });
    },
  };
}
export type LabRepository = ReturnType<typeof createLabRepository>;
