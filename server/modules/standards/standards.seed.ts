import type { SeedStep } from '../../db/seed';
import { recordAudit } from '../../audit';
import type { CertifiedValueInput, StandardKind } from '../../../shared/schemas/standards.schema';
import { createStandardsRepository } from './standards.repository';
import { isoDay } from './standards.service';

/*
 * Demo reference standards. Every name, serial number, certificate number, laboratory and value
 * is invented for the demo. Dates are relative to the seed's clock: one standard is due soon and
 * one is overdue when the demo starts.
 */

type DemoStandard = {
  name: string;
  kind: StandardKind;
  serialNumber: string;
  certificateNumber: string;
  issuingLaboratory: string;
  /** Calibration and due date as days from the seed's "today". */
  calibratedDaysAgo: number;
  dueInDays: number;
  notes: string;
  values: CertifiedValueInput[];
};

const NATIONAL = 'Harrowgate Radiometry Institute (demo)';
const ACCREDITED = 'Fenwick Cross Calibration Services (demo)';

export const DEMO_STANDARDS: DemoStandard[] = [
  {
    name: 'Reference blackbody RB-900 (demo)',
    kind: 'blackbody_source',
    serialNumber: 'RB900-0117',
    certificateNumber: 'HRI-RAD-2026-0311',
    issuingLaboratory: NATIONAL,
    calibratedDaysAgo: 200,
    dueInDays: 530,
    notes: 'Cavity source, 50 °C to 900 °C; aperture 40 mm.',
    values: [
      { quantity: 'Effective emissivity (8 µm to 14 µm)', value: 0.9985, unit: '', expandedUncertainty: 0.0010, coverageFactor: 2 },
      { quantity: 'Radiance temperature correction', value: 0.08, unit: 'K', expandedUncertainty: 0.15, coverageFactor: 2, atValue: 100, atUnit: '°C' },
      { quantity: 'Radiance temperature correction', value: -0.12, unit: 'K', expandedUncertainty: 0.22, coverageFactor: 2, atValue: 300, atUnit: '°C' },
      { quantity: 'Radiance temperature correction', value: -0.31, unit: 'K', expandedUncertainty: 0.40, coverageFactor: 2, atValue: 500, atUnit: '°C' },
    ],
  },
  {
    name: 'Reference thermometer PRT-A (demo)',
    kind: 'reference_thermometer',
    serialNumber: 'PRT-4471-A',
    certificateNumber: 'FCC-T-26-1042',
    issuingLaboratory: ACCREDITED,
    calibratedDaysAgo: 353,
    dueInDays: 12,
    notes: 'Platinum resistance thermometer in the blackbody cavity well.',
    values: [
      { quantity: 'Correction', value: 0.012, unit: 'K', expandedUncertainty: 0.020, coverageFactor: 2, atValue: 0, atUnit: '°C' },
      { quantity: 'Correction', value: 0.018, unit: 'K', expandedUncertainty: 0.025, coverageFactor: 2, atValue: 250, atUnit: '°C' },
      { quantity: 'Correction', value: 0.031, unit: 'K', expandedUncertainty: 0.035, coverageFactor: 2, atValue: 420, atUnit: '°C' },
    ],
  },
  {
    name: 'Reference thermometer PRT-B (demo)',
    kind: 'reference_thermometer',
    serialNumber: 'PRT-4472-B',
    certificateNumber: 'FCC-T-25-0877',
    issuingLaboratory: ACCREDITED,
    calibratedDaysAgo: 374,
    dueInDays: -9,
    notes: 'Spare thermometer; recalibration booked.',
    values: [
      { quantity: 'Correction', value: -0.009, unit: 'K', expandedUncertainty: 0.020, coverageFactor: 2, atValue: 0, atUnit: '°C' },
      { quantity: 'Correction', value: 0.004, unit: 'K', expandedUncertainty: 0.030, coverageFactor: 2, atValue: 250, atUnit: '°C' },
    ],
  },
  {
    name: 'Transfer radiation thermometer TRT-1.6 (demo)',
    kind: 'transfer_radiation_thermometer',
    serialNumber: 'TRT16-2290',
    certificateNumber: 'HRI-RT-2026-0058',
    issuingLaboratory: NATIONAL,
    calibratedDaysAgo: 120,
    dueInDays: 245,
    notes: 'Working wavelength 1.6 µm; size-of-source effect characterised separately.',
    values: [
      { quantity: 'Radiance temperature correction', value: 0.05, unit: 'K', expandedUncertainty: 0.12, coverageFactor: 2, atValue: 400, atUnit: '°C' },
      { quantity: 'Radiance temperature correction', value: 0.09, unit: 'K', expandedUncertainty: 0.18, coverageFactor: 2, atValue: 700, atUnit: '°C' },
      { quantity: 'Radiance temperature correction', value: 0.16, unit: 'K', expandedUncertainty: 0.30, coverageFactor: 2, atValue: 1000, atUnit: '°C' },
    ],
  },
  {
    name: 'Spectroradiometer SR-400 (demo)',
    kind: 'spectroradiometer',
    serialNumber: 'SR400-0931',
    certificateNumber: 'FCC-OPT-26-0219',
    issuingLaboratory: ACCREDITED,
    calibratedDaysAgo: 90,
    dueInDays: 275,
    notes: 'Array spectroradiometer, 350 nm to 1050 nm.',
    values: [
      { quantity: 'Wavelength offset', value: 0.12, unit: 'nm', expandedUncertainty: 0.10, coverageFactor: 2, atValue: 546.07, atUnit: 'nm' },
      { quantity: 'Relative spectral responsivity correction', value: 1.004, unit: '', expandedUncertainty: 0.008, coverageFactor: 2, atValue: 650, atUnit: 'nm' },
    ],
  },
];

const addDays = (d: Date, days: number) => isoDay(new Date(d.getTime() + days * 86_400_000));

export const standardsSeedStep: SeedStep = {
  name: 'demo-reference-standards',
  async run({ db, clock }) {
    const repo = createStandardsRepository(db);
    const now = clock();
    for (const s of DEMO_STANDARDS) {
      const fields = {
        name: s.name,
        kind: s.kind,
        serialNumber: s.serialNumber,
        certificateNumber: s.certificateNumber,
        issuingLaboratory: s.issuingLaboratory,
        calibrationDate: addDays(now, -s.calibratedDaysAgo),
        dueDate: addDays(now, s.dueInDays),
        status: 'in_service' as const,
        notes: s.notes,
      };
      const id = await repo.insert(fields, now, db);
      await repo.replaceValues(id, s.values, db);
      await recordAudit(db, { actor: null, action: 'create', entity: 'reference_standard', entityId: id, after: { ...fields, values: s.values }, at: now });
    }
  },
};
