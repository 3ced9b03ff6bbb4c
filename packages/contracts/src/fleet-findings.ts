import { z } from 'zod';
import { isoDateSchema } from './forecast';
import { categorySchema, damageTypeSchema } from './limits';

/** The decisions a search can ask for: an engineer's signed decision, or none yet. */
export const searchDecisions = ['serviceable', 'repeat-inspection', 'remove', 'none'] as const;
export const searchDecisionSchema = z.enum(searchDecisions);
export type SearchDecision = z.infer<typeof searchDecisionSchema>;

export const findingSearchSortKeys = [
  'inspectionDate',
  'engineSerial',
  'position',
  'lengthMm',
  'areaMm2',
  'depthMm',
  /** By verdict, beyond limits first when descending. */
  'category',
] as const;
export type FindingSearchSortKey = (typeof findingSearchSortKeys)[number];

/** Most findings a page holds; an export holds every match up to `findingExportLimit`. */
export const findingSearchMaxPageSize = 100;
export const findingExportLimit = 20_000;

const id = z.string().trim().min(1).max(64);

/**
 * What the fleet findings search (DESIGN §6) and its export filter and sort by: recorded findings
 * of every inspection that holds records (submitted or later; an owner's, released ones only).
 */
export const findingSearchFilters = {
  modelId: id.optional(),
  row: id.optional(),
  zone: id.optional(),
  damage: damageTypeSchema.optional(),
  category: categorySchema.optional(),
  decision: searchDecisionSchema.optional(),
  /** Inspections on or after this day. */
  from: isoDateSchema.optional(),
  /** Inspections on or before this day. */
  to: isoDateSchema.optional(),
  engineId: id.optional(),
  /** Only this owner's engines (an owner searches their own organisation's in any case). */
  organisationId: id.optional(),
  sort: z.enum(findingSearchSortKeys).default('inspectionDate'),
  order: z.enum(['asc', 'desc']).default('desc'),
};

/** A range of days that ends before it starts is refused. */
export const daysInOrder = (query: { from?: string | undefined; to?: string | undefined }) =>
  !query.from || !query.to || query.from <= query.to;

/** The search, paged on the server. */
export const findingSearchQuerySchema = z
  .strictObject({
    ...findingSearchFilters,
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(findingSearchMaxPageSize).default(25),
  })
  .refine(daysInOrder, { path: ['to'], message: 'The first day comes after the last' });
export type FindingSearchQuery = z.input<typeof findingSearchQuerySchema>;
export type ParsedFindingSearchQuery = z.output<typeof findingSearchQuerySchema>;
/** What selects and orders the findings, without the page. */
export type FindingSearchSelection = Omit<ParsedFindingSearchQuery, 'page' | 'pageSize'>;

/** One recorded finding, with the engine and inspection it is read beside. */
export const findingSearchItemSchema = z.object({
  id: z.string(),
  /** F1, F2, … within its inspection. */
  number: z.number().int(),
  inspectionId: z.string(),
  inspectionDate: isoDateSchema,
  engineId: z.string(),
  engineSerialNumber: z.string(),
  organisationId: z.string(),
  organisationName: z.string(),
  modelId: z.string(),
  modelName: z.string(),
  row: z.string(),
  rowLabel: z.string(),
  position: z.number().int(),
  zone: z.string(),
  damage: damageTypeSchema,
  lengthMm: z.number().nullable(),
  widthMm: z.number().nullable(),
  depthMm: z.number().nullable(),
  areaMm2: z.number().nullable(),
  count: z.number().int().nullable(),
  uncertaintyMm: z.number().nullable(),
  uncertaintyMm2: z.number().nullable(),
  /** The stored verdict; null when the finding was never judged. */
  category: categorySchema.nullable(),
  /** The signed decision in force (an owner's: as released), or null. */
  decision: z.enum(['serviceable', 'repeat-inspection', 'remove']).nullable(),
  imageId: z.string(),
  seriesId: z.string(),
});
export type FindingSearchItem = z.infer<typeof findingSearchItemSchema>;

export const findingSearchResponseSchema = z.object({
  items: z.array(findingSearchItemSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type FindingSearchResponse = z.infer<typeof findingSearchResponseSchema>;
