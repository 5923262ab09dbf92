import type { Db } from '../../db/client';
import { recordAudit, type AuditActor } from '../../audit';
import type { LabPublic, LabSettings, LabSettingsInput } from '../../../shared/schemas/lab.schema';
import type { LabRepository } from './lab.repository';

export function createLabService(deps: { db: Db; labRepo: LabRepository; clock: () => Date }) {
  return {
    async getPublic(): Promise<LabPublic> {
      const { name, address, accreditationNumber } = await deps.labRepo.get();
      return { name, address, accreditationNumber };
    },
    getSettings(): Promise<LabSettings> {
      return deps.labRepo.get();
    },
    /** Saves the settings and audits the change (before and after) in one transaction. */
    async updateSettings(input: LabSettingsInput, actor: AuditActor | null): Promise<LabSettings> {
      return deps.db.transaction(async (tx) => {
        const now = deps.clock();
        const before = await deps.labRepo.get(tx);
        await deps.labRepo.save(input, now, tx);
        const after = await deps.labRepo.get(tx);
        await recordAudit(tx, { actor, action: 'update', entity: 'lab_settings', entityId: '1', before, after, at: now });
        return after;
      });
    },
  };
}
export type LabService = ReturnType<typeof createLabService>;
