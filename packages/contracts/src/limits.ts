import { z } from 'zod';
import { nameText } from './text';

export const damageTypes = [
  'crack',
  'burn',
  'erosion',
  'oxidation',
  'coating-loss',
  'nick',
  'dent',
  'tear',
  'missing-material',
  'tip-curl',
  'tip-rub',
  'blocked-cooling-holes',
  'deposit',
  'distortion',
] as const;
export const damageTypeSchema = z.enum(damageTypes);
export type DamageType = z.infer<typeof damageTypeSchema>;

export const measures = ['length', 'width', 'depth', 'area', 'count'] as const;
export const measureSchema = z.enum(measures);
export type Measure = z.infer<typeof measureSchema>;

export const limitUnits = ['mm', 'in', 'mm2', 'in2', 'count'] as const;
export const limitUnitSchema = z.enum(limitUnits);
export type LimitUnit = z.infer<typeof limitUnitSchema>;

/** Categories from best to worst. */
export const categories = ['serviceable', 'repeat-inspection', 'review', 'beyond-limits'] as const;
export const categorySchema = z.enum(categories);
export type Category = z.infer<typeof categorySchema>;

export const reasonCodes = [
  'not-permitted',
  'count-rule-only',
  'missing-measurement',
  'within-serviceable',
  'within-repeat',
  'exceeds-limit',
  'no-matching-rule',
  'count-per-airfoil',
  'total-per-airfoil',
  'airfoils-per-row',
  'adjacent-airfoils',
] as const;
export const reasonSchema = z.enum(reasonCodes);
export type Reason = z.infer<typeof reasonSchema>;

const limitValue = z.number().finite().min(0).nullable();
const countLimit = z.number().int().min(0).nullable();
const intervalValue = z.number().finite().positive().nullable();

export const intervalSchema = z.strictObject({
  cycles: intervalValue,
  hours: intervalValue,
  days: intervalValue,
});
export type Interval = z.infer<typeof intervalSchema>;

export const beyondActionKinds = [
  'remove-before-next-flight',
  'remove-within',
  'remove-at-next-shop-visit',
] as const;
export const beyondActionSchema = z.strictObject({
  kind: z.enum(beyondActionKinds),
  cycles: intervalValue,
  hours: intervalValue,
});
export type BeyondAction = z.infer<typeof beyondActionSchema>;

const identifier = z.string().trim().min(1).max(100);

/** A damage-limit rule as transcribed from one section of the engine manual. */
export const ruleSchema = z.strictObject({
  id: identifier,
  /**
   * A short title written in the library ("Cracks at the vane edges"), what people read where the
   * rule is named; the id stays beside it, small. Required before a revision is checked.
   */
  title: nameText('Give the title', {
    min: 0,
    max: 80,
    tooLong: 'Keep the title to 80 characters or fewer',
  }).default(''),
  row: identifier,
  zones: z.array(identifier).min(1),
  damage: damageTypeSchema,
  measure: measureSchema,
  unit: limitUnitSchema,
  serviceableMax: limitValue,
  repeatMax: limitValue,
  repeatInterval: intervalSchema.nullable(),
  beyondAction: beyondActionSchema.nullable(),
  notPermitted: z.boolean(),
  maxPerAirfoil: countLimit,
  maxTotalPerAirfoil: limitValue,
  maxAirfoilsPerRow: countLimit,
  maxAdjacentAirfoils: countLimit,
  reference: nameText('Give the reference', { min: 0, max: 300 }),
});
export type Rule = z.infer<typeof ruleSchema>;

const measuredValue = z.number().finite().nullable();

/** A finding as the evaluation sees it: where it is and what was measured. */
export const evaluationFindingSchema = z.strictObject({
  id: identifier,
  row: identifier,
  position: z.number().int(),
  zone: identifier,
  damage: damageTypeSchema,
  lengthMm: measuredValue,
  widthMm: measuredValue,
  depthMm: measuredValue,
  areaMm2: measuredValue,
  count: measuredValue,
  uncertaintyMm: measuredValue,
  uncertaintyMm2: measuredValue,
});
export type EvaluationFinding = z.infer<typeof evaluationFindingSchema>;

/**
 * The most finding–rule matches one `POST /evaluations` may make (each is a judgement in the
 * answer): a whole inspection of 500 findings with 10 rules matching each fits; beyond, 422.
 * Judging and writing out a judgement costs about 1.5 µs here, so one request stays under 10 ms
 * of the server's one JavaScript thread; 1,000 findings and 1,000 rules bound the reading.
 */
export const MAX_EVALUATION_MATCHES = 5_000;

export const evaluationRequestSchema = z.strictObject({
  rows: z.record(identifier, z.strictObject({ count: z.number().int().min(1).max(1000) })),
  rules: z.array(ruleSchema).max(1000, 'At most 1,000 rules go in one evaluation'),
  findings: z
    .array(evaluationFindingSchema)
    .max(1000, 'At most 1,000 findings go in one evaluation'),
});
export type EvaluationRequest = z.infer<typeof evaluationRequestSchema>;

/** How one matching rule judged a finding: the working an engineer can check by hand. */
export const ruleJudgementSchema = z.object({
  ruleId: z.string(),
  category: categorySchema,
  measuredCategory: categorySchema,
  reasons: z.array(reasonSchema),
  value: z.number().nullable(),
  uncertainty: z.number().nullable(),
  unit: limitUnitSchema,
  utilisation: z.number().nullable(),
});
export type RuleJudgement = z.infer<typeof ruleJudgementSchema>;

export const findingEvaluationSchema = z.object({
  id: z.string(),
  category: categorySchema,
  measuredCategory: categorySchema,
  indeterminate: z.boolean(),
  ruleId: z.string().nullable(),
  reasons: z.array(reasonSchema),
  utilisation: z.number().nullable(),
  repeatInterval: intervalSchema.nullable(),
  beyondAction: beyondActionSchema.nullable(),
  judgements: z.array(ruleJudgementSchema),
});
export type FindingEvaluation = z.infer<typeof findingEvaluationSchema>;

export const engineVerdictSchema = z.object({
  category: categorySchema,
  repeatInterval: intervalSchema.nullable(),
  beyondActions: z.array(beyondActionSchema),
  counts: z.record(categorySchema, z.number().int()),
});
export type EngineVerdict = z.infer<typeof engineVerdictSchema>;

export const evaluationResultSchema = z.object({
  findings: z.array(findingEvaluationSchema),
  engine: engineVerdictSchema,
});
export type EvaluationResult = z.infer<typeof evaluationResultSchema>;
