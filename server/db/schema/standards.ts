import { sql } from 'drizzle-orm';
import { check, date, doublePrecision, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { STANDARD_KINDS, STANDARD_STATUSES } from '../../../shared/schemas/standards.schema';

const list = (values: readonly string[]) => sql.raw(values.map((v) => `'${v}'`).join(', '));

/**
 * The laboratory's reference standards (ISO/IEC 17025:2017 §6.4 equipment, §6.5 metrological
 * traceability): what each is, who calibrated it, when it is due again, and its certificate.
 * The certificate PDF lives in the file store (server/files) under its SHA-256.
 */
export const referenceStandards = pgTable(
  'reference_standards',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    name: text('name').notNull(),
    kind: text('kind').notNull(),
    serialNumber: text('serial_number').notNull(),
    certificateNumber: text('certificate_number').notNull(),
    issuingLaboratory: text('issuing_laboratory').notNull(),
    calibrationDate: date('calibration_date', { mode: 'string' }).notNull(),
    dueDate: date('due_date', { mode: 'string' }).notNull(),
    status: text('status').notNull().default('in_service'),
    notes: text('notes').notNull().default(''),
    certificateFileSha256: text('certificate_file_sha256'),
    certificateFileName: text('certificate_file_name'),
    certificateFileSize: integer('certificate_file_size'),
    certificateFileUploadedAt: timestamp('certificate_file_uploaded_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('reference_standards_kind_check', sql`${t.kind} IN (${list(STANDARD_KINDS)})`),
    check('reference_standards_status_check', sql`${t.status} IN (${list(STANDARD_STATUSES)})`),
    check('reference_standards_dates_check', sql`${t.dueDate} >= ${t.calibrationDate}`),
    uniqueIndex('reference_standards_name_unique').on(sql`lower(${t.name})`),
    index('reference_standards_due_idx').on(t.dueDate),
  ],
);

/**
 * Values from a standard's calibration certificate: a quantity with its value, unit, expanded
 * uncertainty U and coverage factor k (so u = U / k, GUM 6.2.1), optionally at a stated point
 * (e.g. a correction at 500 °C, an emissivity at 8 µm–14 µm).
 */
export const referenceStandardValues = pgTable(
  'reference_standard_values',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    standardId: uuid('standard_id')
      .notNull()
      .references(() => referenceStandards.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    quantity: text('quantity').notNull(),
    value: doublePrecision('value').notNull(),
    unit: text('unit').notNull(),
    expandedUncertainty: doublePrecision('expanded_uncertainty').notNull(),
    coverageFactor: doublePrecision('coverage_factor').notNull(),
    atValue: doublePrecision('at_value'),
    atUnit: text('at_unit'),
  },
  (t) => [
    index('reference_standard_values_standard_idx').on(t.standardId, t.position),
    check('reference_standard_values_u_check', sql`${t.expandedUncertainty} >= 0 AND ${t.coverageFactor} > 0`),
  ],
);
