import { z } from 'zod';
import { pageOf, pageQuerySchema } from './paging';
import { nameText, noteText } from './text';
import { intervalSchema } from './limits';
import { baselineSchema, dueStateSchema } from './planning';
import { forecastDimensionSchema, isoDateSchema } from './forecast';

const key = z
  .string()
  .trim()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, {
    message: 'use lower-case letters, digits and dashes, such as hpt1-blade',
  })
  .max(40);
const label = (what: string) => nameText(`Enter the ${what}`);

export const rowKinds = ['combustor-liner', 'fuel-nozzle', 'vane', 'blade'] as const;
export const rowKindSchema = z.enum(rowKinds);
export type RowKind = z.infer<typeof rowKindSchema>;

export const rowKindLabels: Record<RowKind, string> = {
  'combustor-liner': 'Combustor liner',
  'fuel-nozzle': 'Fuel nozzles',
  vane: 'Vane row (NGV)',
  blade: 'Blade row',
};

/** Zones offered by default for each kind of row; a model may list its own. */
export const defaultZones: Record<RowKind, string[]> = {
  'combustor-liner': ['dome', 'outer-liner', 'inner-liner', 'dilution-holes', 'cooling-rings'],
  'fuel-nozzle': ['tip', 'heat-shield', 'swirler'],
  vane: [
    'leading-edge',
    'trailing-edge',
    'pressure-side',
    'suction-side',
    'inner-platform',
    'outer-platform',
    'cooling-holes',
  ],
  blade: [
    'leading-edge',
    'trailing-edge',
    'pressure-side',
    'suction-side',
    'tip',
    'platform',
    'root-fillet',
    'cooling-holes',
  ],
};

export const numberingSchema = z.strictObject({
  /** Where position 1 is, in words an inspector reads off the engine: "12 o'clock", "top dead centre". */
  positionOne: label('place of position 1'),
  direction: z.enum(['clockwise', 'counter-clockwise']),
  viewpoint: z.enum(['aft-looking-forward', 'forward-looking-aft']),
});
export type Numbering = z.infer<typeof numberingSchema>;

export const engineModelRowSchema = z.strictObject({
  key,
  label: label('row name'),
  kind: rowKindSchema,
  /** Number of positions N: 1..N around the circle, N next to 1. */
  count: z.number().int().min(1, { message: 'a row has at least one position' }).max(400),
  numbering: numberingSchema,
  zones: z.array(key).min(1, { message: 'list at least one zone' }).max(30),
  ports: z.array(nameText('Name the port', { max: 60 })).max(20),
});
export type EngineModelRow = z.infer<typeof engineModelRowSchema>;

const rowsSchema = z
  .array(engineModelRowSchema)
  .min(1, { message: 'a model has at least one row' })
  .max(60)
  .superRefine((rows, context) => {
    const seen = new Set<string>();
    rows.forEach((row, index) => {
      if (seen.has(row.key))
        context.addIssue({
          code: 'custom',
          path: [index, 'key'],
          message: `the row key ${row.key} is used twice`,
        });
      seen.add(row.key);
      if (new Set(row.zones).size !== row.zones.length)
        context.addIssue({
          code: 'custom',
          path: [index, 'zones'],
          message: 'a zone is listed twice',
        });
    });
  });

export const engineModelInputSchema = z.strictObject({
  name: label('model name'),
  notes: noteText(2000).default(''),
  /** The routine hot-section inspection interval, whichever dimension comes first (DESIGN §5.6). */
  standardInterval: intervalSchema
    .refine(
      (interval) => interval.cycles !== null || interval.hours !== null || interval.days !== null,
      { message: 'Give the interval in cycles, hours or days' },
    )
    .nullable()
    .default(null),
  rows: rowsSchema,
});
export type EngineModelInput = z.input<typeof engineModelInputSchema>;
export type ParsedEngineModelInput = z.output<typeof engineModelInputSchema>;

export const engineModelSchema = z.object({
  id: z.string(),
  name: z.string(),
  version: z.number().int(),
  notes: z.string(),
  standardInterval: intervalSchema.nullable(),
  rows: z.array(engineModelRowSchema.extend({ inUse: z.boolean() })),
  engineCount: z.number().int(),
  createdAt: z.string(),
});
export type EngineModel = z.infer<typeof engineModelSchema>;

export const engineModelSummarySchema = engineModelSchema
  .omit({ rows: true })
  .extend({ rowCount: z.number().int() });
export type EngineModelSummary = z.infer<typeof engineModelSummarySchema>;
export const engineModelListQuerySchema = pageQuerySchema;
export const engineModelListResponseSchema = pageOf(engineModelSummarySchema);

export const engineStatuses = ['installed', 'removed', 'in-shop'] as const;
export const engineStatusSchema = z.enum(engineStatuses);
export type EngineStatus = z.infer<typeof engineStatusSchema>;
export const engineStatusLabels: Record<EngineStatus, string> = {
  installed: 'Installed',
  removed: 'Removed',
  'in-shop': 'In shop',
};

const optionalText = (max: number) =>
  nameText('', { min: 0, max })
    .nullable()
    .transform((value) => (value ? value : null));

export const engineInputSchema = z.strictObject({
  serialNumber: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9][A-Z0-9-]{2,29}$/, {
      message: 'a serial number is 3 to 30 letters, digits and dashes',
    }),
  modelId: z.string().min(1, { message: 'Choose the engine model' }),
  organisationId: z.string().min(1, { message: 'Choose the owner' }),
  installedPosition: optionalText(20),
  registration: optionalText(12),
  tsn: z.number({ error: 'Enter the time since new in hours' }).finite().min(0).max(500_000),
  csn: z
    .number({ error: 'Enter the cycles since new' })
    .int({ message: 'cycles are whole numbers' })
    .min(0)
    .max(500_000),
  tsnCsnAsOf: isoDateSchema,
  status: engineStatusSchema,
  /** The last hot-section inspection before the engine joined the fleet, when known. */
  preFleetInspection: baselineSchema.nullable().default(null),
});
export type EngineInput = z.input<typeof engineInputSchema>;
export type ParsedEngineInput = z.output<typeof engineInputSchema>;

export const engineUpdateSchema = engineInputSchema
  .omit({ modelId: true, tsn: true, csn: true, tsnCsnAsOf: true })
  .extend({
    // Without the create form's default: a change that does not name it leaves it as it is.
    preFleetInspection: baselineSchema.nullable(),
    /**
     * The shop's release (date, CSN, TSN), entered with the status change that returns the engine
     * to service: it closes every open requirement and is the new baseline (DESIGN §5.6).
     */
    shopRelease: baselineSchema,
  })
  .partial()
  .refine((value) => Object.keys(value).length > 0, { message: 'Nothing to change' });

/** The fields of an engine record as people name them. */
export const engineFieldWords: Record<keyof z.output<typeof engineUpdateSchema>, string> = {
  serialNumber: 'serial number',
  organisationId: 'owner',
  installedPosition: 'installed position',
  registration: 'registration',
  status: 'status',
  preFleetInspection: 'last inspection before the fleet',
  shopRelease: 'shop release',
};
export type EngineUpdate = z.input<typeof engineUpdateSchema>;
export type ParsedEngineUpdate = z.output<typeof engineUpdateSchema>;

export const dailyUtilizationSchema = z.object({
  cyclesPerDay: z.number().nullable(),
  hoursPerDay: z.number().nullable(),
  windowStart: z.string().nullable(),
  windowEnd: z.string().nullable(),
  coveredDays: z.number().int(),
});
export type DailyUtilization = z.infer<typeof dailyUtilizationSchema>;

export const engineSchema = z.object({
  id: z.string(),
  serialNumber: z.string(),
  modelId: z.string(),
  modelName: z.string(),
  organisationId: z.string(),
  organisationName: z.string(),
  installedPosition: z.string().nullable(),
  registration: z.string().nullable(),
  tsn: z.number(),
  csn: z.number().int(),
  tsnCsnAsOf: z.string(),
  status: engineStatusSchema,
  preFleetInspection: baselineSchema.nullable(),
  /** The release of the last shop visit, when the engine has come back from one. */
  shopRelease: baselineSchema.nullable(),
  createdAt: z.string(),
  /**
   * A submitted inspection waiting for an engineer's disposition, and whether it holds a finding
   * beyond limits; null when none waits (and always for customers, who see released ones only).
   */
  awaitingDisposition: z.object({ inspectionId: z.string(), beyondLimits: z.boolean() }).nullable(),
  /**
   * The day of an inspection submitted and not yet released: all an owner learns of it before
   * release (no findings, verdicts or states).
   */
  inspectionInReview: isoDateSchema.nullable(),
  /** When it is next due (DESIGN §5.6), for those who plan; null for customers. */
  nextDue: z
    .object({
      state: dueStateSchema,
      dueDate: z.string().nullable(),
      dueCsn: z.number().nullable(),
      governing: forecastDimensionSchema.nullable(),
    })
    .nullable(),
});
export type Engine = z.infer<typeof engineSchema>;

export const engineDetailSchema = engineSchema.extend({ utilization: dailyUtilizationSchema });
export type EngineDetail = z.infer<typeof engineDetailSchema>;

export const engineSortKeys = [
  'serialNumber',
  'modelName',
  'organisationName',
  'registration',
  'status',
  'tsn',
  'csn',
  /** By due state (overdue first) and then the day the next inspection or removal falls due. */
  'nextDue',
] as const;
export type EngineSortKey = (typeof engineSortKeys)[number];

export const engineListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  sort: z.enum(engineSortKeys).default('serialNumber'),
  order: z.enum(['asc', 'desc']).default('asc'),
  serial: z.string().trim().max(30).optional(),
  modelId: z.string().max(64).optional(),
  organisationId: z.string().max(64).optional(),
  status: engineStatusSchema.optional(),
  /** Engines in this due state (those who may read planning). */
  dueState: dueStateSchema.optional(),
  q: z.string().trim().max(60).optional(),
});
export type EngineListQuery = z.infer<typeof engineListQuerySchema>;

export const engineListResponseSchema = z.object({
  items: z.array(engineSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type EngineListResponse = z.infer<typeof engineListResponseSchema>;

export const utilizationRecordInputSchema = z
  .strictObject({
    periodStart: isoDateSchema,
    periodEnd: isoDateSchema,
    cycles: z
      .number({ error: 'Enter the cycles flown' })
      .int({ message: 'cycles are whole numbers' })
      .min(0)
      .max(100_000),
    hours: z.number({ error: 'Enter the hours flown' }).finite().min(0).max(100_000),
  })
  .refine((value) => value.periodEnd >= value.periodStart, {
    path: ['periodEnd'],
    message: 'the period ends before it starts',
  });
export type UtilizationRecordInput = z.infer<typeof utilizationRecordInputSchema>;

export const utilizationRecordSchema = z.object({
  id: z.string(),
  periodStart: z.string(),
  periodEnd: z.string(),
  cycles: z.number().int(),
  hours: z.number(),
  source: z.enum(['form', 'csv', 'demo']),
  createdAt: z.string(),
});
export type UtilizationRecord = z.infer<typeof utilizationRecordSchema>;

export const utilizationListQuerySchema = pageQuerySchema;
/** A page of an engine's records, newest first, and the daily utilization of all of them. */
export const utilizationListResponseSchema = pageOf(utilizationRecordSchema).extend({
  utilization: dailyUtilizationSchema,
});
export type UtilizationListResponse = z.infer<typeof utilizationListResponseSchema>;

export const utilizationImportPreviewSchema = z.object({
  accepted: z.array(utilizationRecordInputSchema.and(z.object({ line: z.number().int() }))),
  refused: z.array(z.object({ line: z.number().int(), text: z.string(), reason: z.string() })),
});
export type UtilizationImportPreview = z.infer<typeof utilizationImportPreviewSchema>;
