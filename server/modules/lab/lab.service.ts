import type { LabPublic, LabSettings, LabSettingsInput } from '../../../shared/schemas/lab.schema';
import type { LabRepository } from './lab.repository';

export function createLabService(deps: { labRepo: LabRepository; clock: () => Date }) {
  return {
    async getPublic(): Promise<LabPublic> {
      const { name, address, accreditationNumber } = await deps.labRepo.get();
      return { name, address, accreditationNumber };
    },
    getSettings(): Promise<LabSettings> {
      return deps.labRepo.get();
    },
    async updateSettings(input: LabSettingsInput): Promise<LabSettings> {
      await deps.labRepo.save(input, deps.clock());
      return deps.labRepo.get();
    },
  };
}
export type LabService = ReturnType<typeof createLabService>;
