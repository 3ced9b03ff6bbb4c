import { and, asc, eq } from 'drizzle-orm';
import type { Calibration } from '@emberline/contracts/measurement';
import type { DbOrTx } from '../../db/client';
import { images } from '../../db/schema';

export type ImageRow = typeof images.$inferSelect;
export type ImageMeta = Omit<ImageRow, 'thumbnail' | 'preview'>;

const metaColumns = {
  id: images.id,
  inspectionId: images.inspectionId,
  sha256: images.sha256,
  format: images.format,
  bytes: images.bytes,
  width: images.width,
  height: images.height,
  originalName: images.originalName,
  capturedAt: images.capturedAt,
  source: images.source,
  videoFileName: images.videoFileName,
  videoTimeSeconds: images.videoTimeSeconds,
  rowKey: images.rowKey,
  position: images.position,
  port: images.port,
  calibration: images.calibration,
  calibrationImageId: images.calibrationImageId,
  thumbnailType: images.thumbnailType,
  previewType: images.previewType,
  createdBy: images.createdBy,
  createdAt: images.createdAt,
};

/** Image records without their renditions, in upload order. */
export function listImages(db: DbOrTx, inspectionId: string): ImageMeta[] {
  return db
    .select(metaColumns)
    .from(images)
    .where(eq(images.inspectionId, inspectionId))
    .orderBy(asc(images.createdAt), asc(images.id))
    .all();
}

export function findImageMeta(db: DbOrTx, id: string): ImageMeta | undefined {
  return db.select(metaColumns).from(images).where(eq(images.id, id)).get();
}

export function findImageBySha(
  db: DbOrTx,
  inspectionId: string,
  sha256: string,
): ImageMeta | undefined {
  return db
    .select(metaColumns)
    .from(images)
    .where(and(eq(images.inspectionId, inspectionId), eq(images.sha256, sha256)))
    .get();
}

export function readRendition(
  db: DbOrTx,
  id: string,
  rendition: 'thumbnail' | 'preview',
): { data: Buffer; type: string; sha256: string } | undefined {
  const row = db
    .select({
      data: rendition === 'thumbnail' ? images.thumbnail : images.preview,
      type: rendition === 'thumbnail' ? images.thumbnailType : images.previewType,
      sha256: images.sha256,
    })
    .from(images)
    .where(eq(images.id, id))
    .get();
  return row;
}

export function insertImage(db: DbOrTx, row: typeof images.$inferInsert): void {
  db.insert(images).values(row).run();
}

export function tagImage(
  db: DbOrTx,
  id: string,
  tag: { rowKey: string | null; position: number | null; port?: string | null },
): void {
  db.update(images).set(tag).where(eq(images.id, id)).run();
}

export function calibrateImage(
  db: DbOrTx,
  id: string,
  calibration: { calibration: Calibration; calibrationImageId: string },
): void {
  db.update(images).set(calibration).where(eq(images.id, id)).run();
}

/** Every SHA-256 an image record names, for the start-up sweeper. */
export function knownImageHashes(db: DbOrTx): Set<string> {
  return new Set(
    db
      .selectDistinct({ sha256: images.sha256 })
      .from(images)
      .all()
      .map((row) => row.sha256),
  );
}
