import { z } from 'zod';

const coordinate = z.number().finite().min(-1e6).max(1e6);

/** An image point `[x, y]` in pixels of the full-resolution, oriented image; origin top-left. */
export const imagePointSchema = z.tuple([coordinate, coordinate]);
export type ImagePoint = z.infer<typeof imagePointSchema>;

const positiveMm = z.number().finite().positive({ message: 'must be above zero' }).max(10_000);

/** Two points a known true distance apart, in the plane of the damage. */
export const referenceCalibrationSchema = z.strictObject({
  kind: z.literal('reference'),
  p1: imagePointSchema,
  p2: imagePointSchema,
  lengthMm: positiveMm,
});

/**
 * Four image points that are, in this order, the corners (0,0), (W,0), (W,H), (0,H) in mm of a
 * rectangle lying in the damaged surface, for oblique views.
 */
export const planeCalibrationSchema = z.strictObject({
  kind: z.literal('plane'),
  corners: z.tuple([imagePointSchema, imagePointSchema, imagePointSchema, imagePointSchema]),
  widthMm: positiveMm,
  heightMm: positiveMm,
});

export const calibrationSchema = z.discriminatedUnion('kind', [
  referenceCalibrationSchema,
  planeCalibrationSchema,
]);
export type Calibration = z.infer<typeof calibrationSchema>;
export type ReferenceCalibration = z.infer<typeof referenceCalibrationSchema>;
export type PlaneCalibration = z.infer<typeof planeCalibrationSchema>;

export const shapeKindSchema = z.enum(['polyline', 'polygon', 'point']);
export type ShapeKind = z.infer<typeof shapeKindSchema>;

/** The most points a drawn shape may have: measured in a few milliseconds (QUALITY §4). */
export const MAX_SHAPE_POINTS = 2000;

/**
 * A drawn shape. How many points each kind needs (a polyline two, a polygon three, a point one) is
 * a rule of the geometry, checked by the domain (422), not by the schema.
 */
export const shapeSchema = z.strictObject({
  kind: shapeKindSchema,
  points: z.array(imagePointSchema).min(1).max(MAX_SHAPE_POINTS),
});
export type Shape = z.infer<typeof shapeSchema>;

/** Pick uncertainty u: how far, in pixels, a clicked point may be from where it was meant. */
export const pickUncertaintySchema = z.number().finite().min(0).max(50);
export const DEFAULT_PICK_UNCERTAINTY_PX = 1;

export const measurementRequestSchema = z.strictObject({
  calibration: calibrationSchema,
  shape: shapeSchema,
  pickUncertaintyPx: pickUncertaintySchema.optional(),
});
export type MeasurementRequest = z.infer<typeof measurementRequestSchema>;

export const measurementResultSchema = z.object({
  mmPerPx: z.number().nullable(),
  lengthMm: z.number().nullable(),
  areaMm2: z.number().nullable(),
  perimeterMm: z.number().nullable(),
  maxExtentMm: z.number().nullable(),
  uncertaintyMm: z.number().nullable(),
  uncertaintyMm2: z.number().nullable(),
});
export type MeasurementResult = z.infer<typeof measurementResultSchema>;
