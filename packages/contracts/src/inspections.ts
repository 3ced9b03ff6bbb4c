import { z } from 'zod';
import { pageOf, pageQueryFields } from './paging';
import { nameText, noteText } from './text';
import { isoDateSchema } from './forecast';
import { calibrationSchema } from './measurement';

export const inspectionReasons = [
  'scheduled',
  'repeat-inspection',
  'over-temperature',
  'hot-start',
  'foreign-object-ingestion',
  'egt-trend',
  'other',
] as const;
export const inspectionReasonSchema = z.enum(inspectionReasons);
export type InspectionReason = z.infer<typeof inspectionReasonSchema>;
export const inspectionReasonLabels: Record<InspectionReason, string> = {
  scheduled: 'Scheduled',
  'repeat-inspection': 'Repeat inspection',
  'over-temperature': 'Over-temperature',
  'hot-start': 'Hot start',
  'foreign-object-ingestion': 'Foreign-object ingestion',
  'egt-trend': 'Exhaust-gas temperature trend',
  other: 'Other',
};

/** `void`: started by mistake and voided with a reason while a draft; kept, and counts for nothing. */
export const inspectionStates = [
  'draft',
  'submitted',
  'dispositioned',
  'released',
  'void',
] as const;
export const inspectionStateSchema = z.enum(inspectionStates);
export type InspectionState = z.infer<typeof inspectionStateSchema>;
export const inspectionStateLabels: Record<InspectionState, string> = {
  draft: 'Draft',
  submitted: 'Submitted for review',
  dispositioned: 'Dispositioned',
  released: 'Released',
  void: 'Void',
};

const text = (what: string, max = 120) => nameText(`Enter the ${what}`, { max });

export const inspectionInputSchema = z.strictObject({
  engineId: z.string().min(1).max(64),
  date: isoDateSchema,
  reason: inspectionReasonSchema,
  reasonDetail: noteText(500).default(''),
  csn: z
    .number({ error: 'Enter the CSN at inspection' })
    .int({ message: 'cycles are whole numbers' })
    .min(0)
    .max(500_000),
  tsn: z.number({ error: 'Enter the TSN at inspection' }).finite().min(0).max(500_000),
  inspectorName: text('inspector’s name'),
  qualificationRef: text('qualification reference', 60),
  qualificationExpiresOn: isoDateSchema,
  probe: text('probe (model and serial)', 80),
  probeCalibrationDueOn: isoDateSchema,
  rows: z
    .array(z.string().min(1).max(40))
    .min(1, { message: 'List at least one row inspected' })
    .max(60),
});
export type InspectionInput = z.input<typeof inspectionInputSchema>;
export type ParsedInspectionInput = z.output<typeof inspectionInputSchema>;

/** The particulars of a draft, corrected: everything but the engine and the rows listed. */
export const inspectionParticularsInputSchema = inspectionInputSchema.omit({
  engineId: true,
  rows: true,
});
export type InspectionParticularsInput = z.input<typeof inspectionParticularsInputSchema>;
export type ParsedInspectionParticulars = z.output<typeof inspectionParticularsInputSchema>;

/** What a new inspection starts from: the inspector's qualification and their last probe. */
export const inspectionDefaultsSchema = z.object({
  qualificationRef: z.string(),
  qualificationExpiresOn: z.string(),
  /** Where the qualification came from: the inspector's record, or their last inspection. */
  qualificationFrom: z.enum(['record', 'last-inspection']).nullable(),
  probe: z.string(),
  probeCalibrationDueOn: z.string(),
  /** The day of the inspector's last inspection the probe was taken from, if any. */
  probeFrom: z.string().nullable(),
});
export type InspectionDefaults = z.infer<typeof inspectionDefaultsSchema>;

export const voidInspectionInputSchema = z.strictObject({
  reason: noteText(500, {
    min: 5,
    message: 'Say why this inspection is voided (at least a few words)',
  }),
});

export const inspectionFlagCodes = [
  'probe-calibration-expired',
  'qualification-expired',
  'csn-doubt',
  'tsn-doubt',
] as const;
export const inspectionFlagSchema = z.object({
  code: z.enum(inspectionFlagCodes),
  message: z.string(),
  acknowledgedAt: z.string().nullable(),
  acknowledgedBy: z.string().nullable(),
  note: z.string().nullable(),
});
export type InspectionFlag = z.infer<typeof inspectionFlagSchema>;

export const acknowledgeFlagInputSchema = z.strictObject({
  note: noteText(500).pipe(
    z
      .string()
      .min(3, { message: 'Say why it is acceptable, for example the certificate renewed on…' }),
  ),
});

export const imageSchema = z.object({
  id: z.string(),
  inspectionId: z.string(),
  sha256: z.string(),
  width: z.number().int(),
  height: z.number().int(),
  format: z.enum(['jpeg', 'png', 'tiff', 'webp']),
  bytes: z.number().int(),
  originalName: z.string(),
  capturedAt: z.string().nullable(),
  source: z.enum(['upload', 'video-frame']),
  videoFileName: z.string().nullable(),
  videoTimeSeconds: z.number().nullable(),
  rowKey: z.string().nullable(),
  position: z.number().int().nullable(),
  /** The access port the still was taken through, as the inspector names it. */
  port: z.string().nullable(),
  /**
   * The scale of this still, saved the moment it is picked; `sourceImageId` is the still it was
   * picked on (this one, or another of the same size and port whose scale was reused).
   */
  calibration: z.object({ calibration: calibrationSchema, sourceImageId: z.string() }).nullable(),
  createdAt: z.string(),
});
export type Image = z.infer<typeof imageSchema>;

export const rejectedFileSchema = z.object({
  filename: z.string(),
  code: z.enum(['unsupported_type', 'too_large', 'too_many_pixels', 'unreadable', 'duplicate']),
  message: z.string(),
  imageId: z.string().optional(),
});
export type RejectedFile = z.infer<typeof rejectedFileSchema>;

export const uploadResponseSchema = z.object({
  images: z.array(imageSchema),
  rejected: z.array(rejectedFileSchema),
});
export type UploadResponse = z.infer<typeof uploadResponseSchema>;

export const imageTagInputSchema = z.strictObject({
  rowKey: z.string().min(1).max(40).nullable(),
  position: z.number().int().min(1).max(1000).nullable(),
  /** Left out: the port stays as it is. Null or blank: no port. */
  port: z
    .string()
    .trim()
    .max(40, 'Name the port in 40 characters or fewer')
    .regex(/^[^\p{Cc}]*$/u, 'The port name cannot hold control characters')
    .transform((value) => value || null)
    .nullable()
    .optional(),
});
export type ImageTagInput = z.infer<typeof imageTagInputSchema>;

/** A scale picked on this still, or the scale of another still of the same size and port. */
export const imageCalibrationInputSchema = z.union([
  z.strictObject({ calibration: calibrationSchema }),
  z.strictObject({ fromImageId: z.string().trim().min(1).max(64) }),
]);
export type ImageCalibrationInput = z.infer<typeof imageCalibrationInputSchema>;

export const inspectionSchema = z.object({
  id: z.string(),
  engineId: z.string(),
  engineSerialNumber: z.string(),
  organisationId: z.string(),
  date: z.string(),
  reason: inspectionReasonSchema,
  reasonDetail: z.string(),
  csn: z.number().int(),
  tsn: z.number(),
  inspectorName: z.string(),
  qualificationRef: z.string(),
  qualificationExpiresOn: z.string(),
  probe: z.string(),
  probeCalibrationDueOn: z.string(),
  rows: z.array(z.string()),
  state: inspectionStateSchema,
  flags: z.array(inspectionFlagSchema),
  imageCount: z.number().int(),
  /** Why an engineer sent it back to draft, who and when, until it is submitted again. */
  returnedReason: z.string().nullable(),
  returnedByName: z.string().nullable(),
  returnedAt: z.string().nullable(),
  /** When it was last submitted for review. */
  submittedAt: z.string().nullable(),
  /** Why it was voided, by whom and when (state `void`). */
  voidReason: z.string().nullable(),
  voidedByName: z.string().nullable(),
  voidedAt: z.string().nullable(),
  /** The report revision of its latest release; 0 before the first. */
  releaseRevision: z.number().int(),
  /**
   * Submitted or later, and judged against a limit revision that is no longer the one in force
   * (DESIGN §5.5): the engineer decides what the newer revision changes.
   */
  newerRevisionInForce: z.boolean(),
  createdAt: z.string(),
});
export type Inspection = z.infer<typeof inspectionSchema>;

export const inspectionDetailSchema = inspectionSchema.extend({ images: z.array(imageSchema) });
export type InspectionDetail = z.infer<typeof inspectionDetailSchema>;

export const inspectionListQuerySchema = z.strictObject({
  engineId: z.string().max(64).optional(),
  ...pageQueryFields(50),
});
export type InspectionListQuery = z.output<typeof inspectionListQuerySchema>;
export const inspectionListResponseSchema = pageOf(inspectionSchema);

export const returnToDraftInputSchema = z.strictObject({
  reason: noteText(1000, { min: 5, message: 'Say what the inspector should look at again' }),
  /** Needed when signed dispositions are withdrawn by sending it back. */
  password: z.string().max(200).optional(),
});
export type ReturnToDraftInput = z.infer<typeof returnToDraftInputSchema>;
