import { z } from 'zod';
import { forecastDimensionSchema, isoDateSchema } from './forecast';
import { beyondActionSchema, intervalSchema } from './limits';
import { noteText } from './text';

/** Where an engine stands against its inspections (DESIGN §5.6), computed when read. */
export const dueStates = [
  'overdue',
  'due-soon',
  'ok',
  'unknown',
  'awaiting-disposition',
  'in-shop',
  'removed',
] as const;
export const dueStateSchema = z.enum(dueStates);
export type DueState = z.infer<typeof dueStateSchema>;

export const dueStateLabels: Record<DueState, string> = {
  overdue: 'Overdue',
  'due-soon': 'Due soon',
  ok: 'In date',
  unknown: 'Unknown',
  'awaiting-disposition': 'Awaiting disposition',
  'in-shop': 'In shop',
  removed: 'Removed',
};

/** A dated baseline: the inspection or shop release a standard interval runs from. */
export const baselineSchema = z.strictObject({
  date: isoDateSchema,
  csn: z.number().int().min(0),
  tsn: z.number().finite().min(0),
});
export type Baseline = z.infer<typeof baselineSchema>;

/** An open requirement: a signed repeat or remove decision not yet closed by a later inspection. */
export const requirementSchema = z.object({
  kind: z.enum(['repeat', 'remove']),
  row: z.string(),
  position: z.number().int(),
  inspectionId: z.string(),
  inspectionDate: isoDateSchema,
  findingId: z.string(),
  seriesId: z.string(),
  interval: intervalSchema.nullable(),
  action: beyondActionSchema.nullable(),
});
export type Requirement = z.infer<typeof requirementSchema>;

export const dueSchema = z.object({
  dueCsn: z.number().nullable(),
  dueTsn: z.number().nullable(),
  dueDate: z.string().nullable(),
  governing: forecastDimensionSchema.nullable(),
});
export type Due = z.infer<typeof dueSchema>;

/** How an engine's next inspection due moved, from what to what and why (DESIGN §5.6). */
export const dueMoveSchema = z.object({
  from: dueSchema.nullable(),
  to: dueSchema.nullable(),
  /** What moved it, in words: the signature, the utilization record, the change of record. */
  reason: z.string(),
  at: z.string(),
  /** The due date came earlier than a booking's planned date (planners were e-mailed). */
  bookingOverrun: z.boolean(),
});
export type DueMove = z.infer<typeof dueMoveSchema>;

export const engineDueSchema = z.object({
  state: dueStateSchema,
  /** Why the state is what it is, in words. */
  reason: z.string(),
  governedBy: z
    .object({
      kind: z.enum(['standard', 'repeat']),
      row: z.string().nullable(),
      position: z.number().int().nullable(),
      inspectionId: z.string().nullable(),
    })
    .nullable(),
  /** The interval the governing due date was computed with. */
  interval: intervalSchema.nullable(),
  nextInspection: dueSchema.nullable(),
  removal: z
    .object({
      kind: beyondActionSchema.shape.kind,
      dueCsn: z.number().nullable(),
      dueTsn: z.number().nullable(),
      dueDate: z.string().nullable(),
      inspectionId: z.string(),
    })
    .nullable(),
  requirements: z.array(requirementSchema),
  csnNow: z.number().nullable(),
  tsnNow: z.number().nullable(),
  trendWarnings: z.array(
    z.object({ seriesId: z.string(), findingId: z.string(), cyclesRemaining: z.number() }),
  ),
  /** The last time the next inspection due moved. */
  lastMove: dueMoveSchema.nullable(),
  booking: z
    .object({
      plannedDate: isoDateSchema,
      note: z.string(),
      bookedByName: z.string(),
      bookedAt: z.string(),
      /** The due date when it was booked. */
      dueDateAtBooking: z.string().nullable(),
      /** The due date moved earlier than the planned date since it was booked. */
      afterDueDate: z.boolean(),
    })
    .nullable(),
});
export type EngineDue = z.infer<typeof engineDueSchema>;

export const bookingInputSchema = z.strictObject({
  plannedDate: isoDateSchema,
  note: noteText(500).default(''),
});
export type BookingInput = z.input<typeof bookingInputSchema>;
export type ParsedBookingInput = z.output<typeof bookingInputSchema>;

export const planningQuerySchema = z.strictObject({
  /** Engines whose next inspection or removal falls due on or after / on or before this day. */
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  state: dueStateSchema.optional(),
  organisationId: z.string().max(64).optional(),
  modelId: z.string().max(64).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type PlanningQuery = z.infer<typeof planningQuerySchema>;

export const planningItemSchema = engineDueSchema.extend({
  engineId: z.string(),
  serialNumber: z.string(),
  modelId: z.string(),
  modelName: z.string(),
  organisationId: z.string(),
  organisationName: z.string(),
  registration: z.string().nullable(),
});
export type PlanningItem = z.infer<typeof planningItemSchema>;

export const planningResponseSchema = z.object({
  items: z.array(planningItemSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type PlanningResponse = z.infer<typeof planningResponseSchema>;
