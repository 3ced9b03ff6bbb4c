import { z } from 'zod';
import { pageOf, pageQueryFields, pageQuerySchema } from './paging';
import { noteText } from './text';
import { isoDateSchema } from './forecast';
import {
  beyondActionSchema,
  categorySchema,
  damageTypeSchema,
  findingEvaluationSchema,
  intervalSchema,
} from './limits';
import { calibrationSchema, pickUncertaintySchema, shapeSchema } from './measurement';

const id = z.string().trim().min(1).max(64);
const key = z.string().trim().min(1).max(100);

export const measurementMethods = ['image', 'probe'] as const;
export const measurementMethodSchema = z.enum(measurementMethods);
export type MeasurementMethod = z.infer<typeof measurementMethodSchema>;
export const measurementMethodLabels: Record<MeasurementMethod, string> = {
  image: 'Measured on the image',
  probe: 'Measured with the probe',
};

const enteredMm = z.number().finite().min(0, { message: 'cannot be negative' }).max(10_000);

/**
 * A finding as an inspector records it. For method `image` the length, area, perimeter, extent
 * and their uncertainty are computed by the server from the shape and the calibration: numbers
 * sent for them are ignored. For method `probe` they are taken as entered, with their uncertainty.
 * Depth, width and count are always entered.
 */
export const findingInputSchema = z.strictObject({
  imageId: id,
  shape: shapeSchema,
  calibration: calibrationSchema.nullable().default(null),
  /** The image the calibration was picked on, when it is reused from another of the same size. */
  calibrationImageId: id.nullable().default(null),
  pickUncertaintyPx: pickUncertaintySchema.default(1),
  row: key,
  position: z
    .number({ error: 'enter the position number' })
    .int({ message: 'positions are whole numbers' })
    .min(1)
    .max(2000),
  zone: key,
  damage: damageTypeSchema,
  method: measurementMethodSchema,
  lengthMm: enteredMm.nullable().default(null),
  areaMm2: enteredMm.nullable().default(null),
  perimeterMm: enteredMm.nullable().default(null),
  maxExtentMm: enteredMm.nullable().default(null),
  uncertaintyMm: enteredMm.nullable().default(null),
  uncertaintyMm2: enteredMm.nullable().default(null),
  widthMm: enteredMm.nullable().default(null),
  depthMm: enteredMm.nullable().default(null),
  count: z
    .number()
    .int({ message: 'a count is a whole number' })
    .min(0)
    .max(10_000)
    .nullable()
    .default(null),
  notes: noteText(2000).default(''),
  /** The same damage recorded in an earlier inspection of this engine: the damage series. */
  previousFindingId: id.nullable().default(null),
});
export type FindingInput = z.input<typeof findingInputSchema>;
export type ParsedFindingInput = z.output<typeof findingInputSchema>;

/**
 * What the inspector enters about a finding beside its drawing: where it is, what it is, the
 * entered values and, for the probe, the measured ones. The form for a new finding and the form
 * that corrects a recorded one both validate with it.
 */
export const findingDetailsSchema = findingInputSchema.pick({
  row: true,
  position: true,
  zone: true,
  damage: true,
  method: true,
  lengthMm: true,
  areaMm2: true,
  uncertaintyMm: true,
  uncertaintyMm2: true,
  widthMm: true,
  depthMm: true,
  count: true,
  notes: true,
  previousFindingId: true,
});
export type FindingDetails = z.input<typeof findingDetailsSchema>;

export const voidInputSchema = z.strictObject({
  reason: noteText(500, { min: 3, message: 'Say why this is void (at least 3 characters)' }),
});

/** The calibration a measurement used, kept with the finding so that it can be checked later. */
export const calibrationSnapshotSchema = z.object({
  calibration: calibrationSchema,
  imageId: z.string(),
  imageWidth: z.number().int(),
  imageHeight: z.number().int(),
});
export type CalibrationSnapshot = z.infer<typeof calibrationSnapshotSchema>;

export const findingStatuses = ['recorded', 'void'] as const;

export const findingSchema = z.object({
  id: z.string(),
  /** F1, F2, … in the order recorded in the inspection. */
  number: z.number().int(),
  inspectionId: z.string(),
  imageId: z.string(),
  shape: shapeSchema,
  calibration: calibrationSnapshotSchema.nullable(),
  pickUncertaintyPx: z.number(),
  row: z.string(),
  position: z.number().int(),
  zone: z.string(),
  damage: damageTypeSchema,
  method: measurementMethodSchema,
  mmPerPx: z.number().nullable(),
  lengthMm: z.number().nullable(),
  areaMm2: z.number().nullable(),
  perimeterMm: z.number().nullable(),
  maxExtentMm: z.number().nullable(),
  uncertaintyMm: z.number().nullable(),
  uncertaintyMm2: z.number().nullable(),
  widthMm: z.number().nullable(),
  depthMm: z.number().nullable(),
  count: z.number().int().nullable(),
  notes: z.string(),
  previousFindingId: z.string().nullable(),
  seriesId: z.string(),
  status: z.enum(findingStatuses),
  voidReason: z.string().nullable(),
  voidedAt: z.string().nullable(),
  /** The stored verdict of the last evaluation of the whole inspection; null for a void finding. */
  evaluation: findingEvaluationSchema.nullable(),
  limitSetId: z.string().nullable(),
  limitSetRevision: z.string().nullable(),
  evaluatedAt: z.string().nullable(),
  createdByName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Finding = z.infer<typeof findingSchema>;

export const coverageStatuses = ['full', 'partial', 'none'] as const;
export const coverageStatusSchema = z.enum(coverageStatuses);
export type CoverageStatus = z.infer<typeof coverageStatusSchema>;
export const coverageStatusLabels: Record<CoverageStatus, string> = {
  full: 'Fully viewed',
  partial: 'Partly viewed',
  none: 'Not viewed',
};

export const coverageInputSchema = z.strictObject({
  status: coverageStatusSchema,
  /** For a partly viewed row: the positions that were seen. */
  viewedPositions: z.array(z.number().int().min(1).max(2000)).max(2000).default([]),
  /** The explicit result "no damage found" for the row. */
  noDamageFound: z.boolean().default(false),
  /** Why a row was not fully viewed (access, time, probe reach). */
  reason: noteText(500).default(''),
});
export type CoverageInput = z.input<typeof coverageInputSchema>;
export type ParsedCoverageInput = z.output<typeof coverageInputSchema>;

export const rowCoverageSchema = z.object({
  row: z.string(),
  label: z.string(),
  count: z.number().int(),
  /** False until the inspector records the row's coverage; an unrecorded row counts as not viewed. */
  recorded: z.boolean(),
  status: coverageStatusSchema,
  viewedPositions: z.array(z.number().int()),
  noDamageFound: z.boolean(),
  reason: z.string(),
  /** Listed, not fully viewed, and no reason given: the outcome is at best review. */
  gap: z.boolean(),
  findingCount: z.number().int(),
  updatedAt: z.string().nullable(),
});
export type RowCoverage = z.infer<typeof rowCoverageSchema>;

export const limitSetRefSchema = z.object({
  id: z.string(),
  revision: z.string(),
  title: z.string(),
  invented: z.boolean(),
});

/** What the inspection comes to: the worst verdict, the counts, the strictest interval, removals. */
export const inspectionOutcomeSchema = z.object({
  category: categorySchema,
  /** The worst verdict of the findings alone, before the coverage rule. */
  findingsCategory: categorySchema,
  counts: z.record(categorySchema, z.number().int()),
  repeatInterval: intervalSchema.nullable(),
  beyondActions: z.array(beyondActionSchema),
  /** Rows listed but not fully viewed without a stated reason. */
  coverageGaps: z.array(z.string()),
  limitSet: limitSetRefSchema.nullable(),
});
export type InspectionOutcome = z.infer<typeof inspectionOutcomeSchema>;

export const findingListResponseSchema = z.object({
  items: z.array(findingSchema),
  outcome: inspectionOutcomeSchema,
});
export type FindingListResponse = z.infer<typeof findingListResponseSchema>;

export const coverageResponseSchema = z.object({
  rows: z.array(rowCoverageSchema),
  outcome: inspectionOutcomeSchema,
});
export type CoverageResponse = z.infer<typeof coverageResponseSchema>;

export const seriesCandidatesQuerySchema = z.strictObject({
  row: key,
  position: z.coerce.number().int().min(1).max(2000),
  zone: key.optional(),
  damage: damageTypeSchema,
  ...pageQueryFields(50),
});

/** An earlier finding of the same engine, offered as the same damage seen again. */
export const seriesEntrySchema = z.object({
  findingId: z.string(),
  number: z.number().int(),
  inspectionId: z.string(),
  inspectionDate: isoDateSchema,
  csn: z.number().int(),
  tsn: z.number(),
  row: z.string(),
  position: z.number().int(),
  zone: z.string(),
  damage: damageTypeSchema,
  lengthMm: z.number().nullable(),
  areaMm2: z.number().nullable(),
  depthMm: z.number().nullable(),
  uncertaintyMm: z.number().nullable(),
  uncertaintyMm2: z.number().nullable(),
  category: categorySchema.nullable(),
  seriesId: z.string(),
});
export type SeriesEntry = z.infer<typeof seriesEntrySchema>;
export const seriesQuerySchema = pageQuerySchema;
export const seriesListResponseSchema = pageOf(seriesEntrySchema);
